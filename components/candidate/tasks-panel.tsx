import Link from "next/link";
import { ObservationUpload } from "@/components/observations/observation-upload";
import { Avatar } from "@/components/ui/avatar";
import { Badge } from "@/components/ui/badge";
import type { CandidateTaskSummary } from "@/lib/data/candidate-detail";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { priorityLabels, taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";

/** The candidate's follow-up tasks and where each stands. */
export function TasksPanel({
  candidateId,
  tasks,
  timeZone,
  canRecord = false,
}: {
  candidateId: string;
  tasks: CandidateTaskSummary[];
  timeZone: string;
  /** the viewer's role may log exposures (the server still checks each row's instrument and the task holder) */
  canRecord?: boolean;
}) {
  if (tasks.length === 0) return <p className="text-sm text-muted">No follow-up tasks. They are planned when the candidate goes to Pursue.</p>;
  return (
    <ul className="space-y-2 text-sm">
      {tasks.map((t) => (
        <li key={t.id} className="rounded-md border border-line p-2">
          <div className="flex flex-wrap items-center gap-2">
            <span className="font-medium">{taskKindLabels[t.kind]}</span>
            <Badge tone={t.state === "reported" ? "ok" : t.state === "cancelled" ? "neutral" : "accent"}>{taskStateLabels[t.state]}</Badge>
            <span className="text-xs text-muted">{priorityLabels[t.priority] ?? `P${t.priority}`}</span>
          </div>
          <p className="text-xs text-muted">
            {t.site ? `${t.site.code} · ${t.site.name}` : "Any site"}
            {t.windowStart ? (
              <>
                {" "}· from <time dateTime={isoUtc(t.windowStart)} title={isoUtc(t.windowStart)}>{formatInZone(t.windowStart, timeZone)}</time>
              </>
            ) : null}
          </p>
          {t.claimedBy ? (
            <p className="mt-1 flex items-center gap-1.5 text-xs">
              <Avatar name={t.claimedBy.name} initials={t.claimedBy.initials} className="h-5 w-5" /> {t.claimedBy.name}
            </p>
          ) : null}
          {canRecord && t.state !== "cancelled" ? <ObservationUpload taskId={t.id} candidateId={candidateId} /> : null}
        </li>
      ))}
      <li>
        <Link href={`/follow-up?candidate=${candidateId}`} className="text-xs text-accent hover:underline">
          See these tasks on the follow-up board
        </Link>
      </li>
    </ul>
  );
}
