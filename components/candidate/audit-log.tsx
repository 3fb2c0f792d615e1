import { Avatar } from "@/components/ui/avatar";
import type { AuditEntry, PersonRef } from "@/lib/data/candidates";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";
import { triageLabels } from "@/lib/triage/transitions";
import type { TaskKind, TaskState } from "@/db/schema/tasks";
import type { TriageState } from "@/db/schema/candidates";

const triage = (s: string | null) => (s && s in triageLabels ? triageLabels[s as TriageState] : (s ?? "?"));
const task = (s: string | null) => (s && s in taskStateLabels ? taskStateLabels[s as TaskState] : (s ?? "?"));
const str = (v: unknown) => (typeof v === "string" ? v : v === undefined || v === null ? "" : String(v));

/** One audit entry in words. */
export function describeAudit(e: AuditEntry, people: Map<string, PersonRef>): string {
  const d = e.data ?? {};
  const via = d.via ? ` (via ${str(d.via)})` : "";
  switch (e.kind) {
    case "candidate.created":
      return `Arrived from the feed: revision ${str(d.revision)}, ${str(d.stage)}`;
    case "candidate.revised":
      return `Revision ${str(d.revision)} arrived (was ${str(d.previousRevision ?? d.currentRevision)}), stage ${str(d.stage)}`;
    case "candidate.revision-stale":
      return `Revision ${str(d.revision)} arrived after revision ${str(d.currentRevision ?? d.current)}; kept in the history only`;
    case "candidate.withdrawn":
      return "Withdrawn by the feed; open follow-up tasks were cancelled";
    case "candidate.triaged":
      return `Moved from ${triage(e.fromState)} to ${triage(e.toState)}${via}${d.reason ? `: “${str(d.reason)}”` : ""}`;
    case "candidate.assigned": {
      const owner = d.ownerId ? (people.get(str(d.ownerId))?.name ?? "someone") : null;
      return owner ? `Assigned to ${owner}${via}` : `Owner cleared${via}`;
    }
    case "candidate.note-added":
      return "Added a note";
    case "task.created":
      return `Planned a task: ${taskKindLabels[str(d.kind) as TaskKind] ?? str(d.kind)}`;
    case "task.state-changed":
      return `Task ${task(e.fromState)} → ${task(e.toState)}`;
    case "task.cancelled":
      return `Task cancelled${d.reason ? `: “${str(d.reason)}”` : ""}`;
    case "task.reported":
      return "Task reported";
    case "page.queued":
      return `Paging queued (${str(d.reason) || "page"})`;
    case "escalation.fired":
      return `Escalated to ${str(d.target) || "the next step"}`;
    case "notification.failed":
      return `A ${str(d.channel)} notification could not be delivered`;
    case "skymap.uploaded":
      return "Sky map uploaded";
    default:
      return e.kind;
  }
}

/** Who did what and when, oldest first: the candidate's slice of the append-only event log. */
export function AuditLog({ entries, people, timeZone }: { entries: AuditEntry[]; people: Map<string, PersonRef>; timeZone: string }) {
  if (entries.length === 0) return <p className="text-sm text-muted">Nothing recorded yet.</p>;
  return (
    <ol className="space-y-2 text-sm" data-testid="audit-log">
      {entries.map((e) => (
        <li key={e.id} className="grid grid-cols-[auto_1fr] gap-x-2">
          {e.actor ? <Avatar name={e.actor.name} initials={e.actor.initials} className="mt-0.5 h-5 w-5" /> : <span className="mt-0.5 h-5 w-5 rounded-full border border-line" aria-hidden />}
          <div>
            <p>
              <span className="font-medium">{e.actor?.name ?? "System"}</span> · {describeAudit(e, people)}
            </p>
            <time className="text-xs text-muted" dateTime={isoUtc(e.at)} title={isoUtc(e.at)}>
              {formatInZone(e.at, timeZone)}
            </time>
          </div>
        </li>
      ))}
    </ol>
  );
}
