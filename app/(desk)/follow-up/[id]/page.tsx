import { MapPin } from "lucide-react";
import Link from "next/link";
import { notFound } from "next/navigation";
import { TaskPlanView } from "@/components/plans/task-plan-view";
import { Badge } from "@/components/ui/badge";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { listSites } from "@/lib/data/sites";
import { listTasks } from "@/lib/data/tasks";
import { formatWindow, yearInZone } from "@/lib/format/time";
import { listInstruments } from "@/lib/instruments/service";
import { getCandidatePlans } from "@/lib/services/read-plans";
import { priorityLabels, taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";

export const dynamic = "force-dynamic";
export const metadata = { title: "Follow-up task" };

/** One follow-up task: what to observe, and its pointing plan to work through at the telescope (phone-sized first). */
export default async function TaskPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser();
  const { id } = await params;
  const [task] = await listTasks({ taskId: id }, user);
  if (!task) notFound();
  const [plans, instruments, siteRows] = await Promise.all([
    getCandidatePlans(task.candidate.id),
    task.site ? listInstruments(task.site.id) : Promise.resolve([]),
    task.site ? listSites(task.site.id) : Promise.resolve([]),
  ]);
  const observesHere = siteRows[0]?.observers.some((o) => o.id === user.id) ?? false;
  const unfinished = task.state !== "cancelled" && task.state !== "reported";
  const canPlan = Boolean(task.site) && unfinished && hasRole(user, can.planPointings) && (user.role !== "observer" || observesHere);
  const canTick = hasRole(user, can.tickPointings) && (user.role !== "observer" || observesHere || task.claimedBy?.id === user.id);
  const window = formatWindow(task.windowStart, task.windowEnd, user.timeZone, yearInZone(new Date(), user.timeZone));
  return (
    <div className="space-y-4" data-testid="task-page">
      <header className="space-y-1">
        <p className="text-sm text-muted">
          <Link href="/follow-up" className="hover:text-fg">
            Follow-up board
          </Link>{" "}
          /{" "}
          <Link href={`/candidates/${task.candidate.id}`} className="font-mono hover:text-fg">
            {task.candidate.externalId}
          </Link>
        </p>
        <h1 className="flex flex-wrap items-center gap-2 text-xl font-semibold">
          {taskKindLabels[task.kind]}
          <Badge tone={task.state === "reported" ? "ok" : task.state === "cancelled" ? "neutral" : "accent"}>{taskStateLabels[task.state]}</Badge>
        </h1>
        <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-muted">
          <span className="flex items-center gap-1">
            <MapPin aria-hidden className="h-3.5 w-3.5" />
            {task.site ? `${task.site.code} · ${task.site.name}` : "Any site"}
          </span>
          {window ? <span>Window {window}</span> : null}
          <span>{priorityLabels[task.priority] ?? `P${task.priority}`}</span>
          {task.claimedBy ? <span>Held by {task.claimedBy.name}</span> : null}
        </p>
        {task.notes ? <p className="text-sm">{task.notes}</p> : null}
      </header>
      <Panel>
        <PanelTitle>Pointing plan</PanelTitle>
        {task.site ? (
          <TaskPlanView
            candidateId={task.candidate.id}
            taskId={task.id}
            initialPlans={plans}
            instruments={instruments.map((i) => ({ id: i.id, name: i.name, siteCode: task.site?.code ?? "", areaDeg2: i.areaDeg2 }))}
            canPlan={canPlan}
            canTick={canTick}
          />
        ) : (
          <p className="text-sm text-muted">This task is for any site: a pointing plan belongs to one site&apos;s instrument, so plan from the candidate page.</p>
        )}
      </Panel>
    </div>
  );
}
