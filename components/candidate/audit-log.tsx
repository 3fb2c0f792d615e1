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

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const count = (v: unknown) => (Array.isArray(v) ? v.length : 0);

/** One audit entry in words; `candidateId` is the page's candidate, for entries written on both sides of a move. */
export function describeAudit(e: AuditEntry, people: Map<string, PersonRef>, candidateId?: string): string {
  const d = e.data ?? {};
  const via = d.via ? ` (via ${str(d.via)})` : "";
  switch (e.kind) {
    case "candidate.created":
      return `Arrived from the feed: revision ${str(d.revision)}, ${str(d.stage)}`;
    case "candidate.revised":
      return `${d.source ? `${str(d.source)}: r` : "R"}evision ${str(d.revision)} arrived (was ${str(d.previousRevision ?? d.currentRevision)}), stage ${str(d.stage)}`;
    case "candidate.revision-stale":
      return `Revision ${str(d.revision)} arrived after revision ${str(d.currentRevision ?? d.current)}; kept in the history only`;
    case "candidate.trigger-joined":
      return `Trigger ${str(d.externalId)} from ${str(d.source)} joined${d.preferred ? " and is now preferred" : ""} (${plural(Number(d.triggerCount ?? 0), "pipeline", "pipelines")})`;
    case "candidate.preferred-changed":
      return `Preferred trigger is now ${str(d.externalId)} from ${str(d.source)} (${str(d.reason)})`;
    case "candidate.trigger-split":
      return d.fromCandidateId === candidateId
        ? `Split ${plural(count(d.triggerIds), "trigger", "triggers")} out into ${d.returnedToMergedCandidate ? "the candidate it was merged from" : "a candidate of its own"}`
        : `Split out of another candidate (${plural(count(d.triggerIds), "trigger", "triggers")})`;
    case "candidate.merged":
      return d.fromCandidateId === candidateId
        ? "Merged into another candidate; its triggers moved there"
        : `Another candidate merged into this one (${plural(count(d.triggerIds), "trigger", "triggers")})`;
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
    case "observation.recorded":
      return `Logged ${plural(Number(d.count ?? 0), "exposure", "exposures")}${d.via === "csv" ? " from a CSV file" : d.via === "tick" ? " (a planned pointing ticked)" : ""}`;
    case "observation.withdrawn":
      return `Took back ${plural(Number(d.count ?? 0), "exposure", "exposures")} (a planned pointing unticked)`;
    case "counterpart.reported":
      return `Reported a counterpart${d.name ? ` “${str(d.name)}”` : ""} at RA ${Number(d.raDeg).toFixed(3)}°, Dec ${Number(d.decDeg).toFixed(3)}°`;
    default:
      return e.kind;
  }
}

/** Who did what and when, oldest first: the candidate's slice of the append-only event log. */
export function AuditLog({
  entries,
  people,
  timeZone,
  candidateId,
}: {
  entries: AuditEntry[];
  people: Map<string, PersonRef>;
  timeZone: string;
  candidateId?: string;
}) {
  if (entries.length === 0) return <p className="text-sm text-muted">Nothing recorded yet.</p>;
  return (
    <ol className="space-y-2 text-sm" data-testid="audit-log">
      {entries.map((e) => (
        <li key={e.id} className="grid grid-cols-[auto_1fr] gap-x-2">
          {e.actor ? <Avatar name={e.actor.name} initials={e.actor.initials} className="mt-0.5 h-5 w-5" /> : <span className="mt-0.5 h-5 w-5 rounded-full border border-line" aria-hidden />}
          <div>
            <p>
              <span className="font-medium">{e.actor?.name ?? "System"}</span> · {describeAudit(e, people, candidateId)}
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
