import Link from "next/link";
import { classLabels } from "@/lib/format/classes";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { formatDurationMs } from "@/lib/review/format";
import type { HandoffSummary } from "@/lib/review/handoff-summary";
import { steps } from "@/lib/review/steps";
import { triageLabels } from "@/lib/triage/transitions";
import type { SourceClass, TriageState } from "@/db/schema/candidates";
import type { TaskKind, TaskState } from "@/db/schema/tasks";
import { taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";

const cls = (c: string | null) => (c ? (classLabels[c as SourceClass] ?? c) : "pending");
const state = (s: string) => triageLabels[s as TriageState] ?? s;

function When({ ms, tz }: { ms: number; tz: string }) {
  return (
    <time dateTime={isoUtc(ms)} title={isoUtc(ms)}>
      {formatInZone(ms, tz).slice(0, 16)}
    </time>
  );
}

function Section({ title, total, shown, children }: { title: string; total: number; shown: number; children: React.ReactNode }) {
  return (
    <section className="min-w-0 break-inside-avoid rounded-lg border border-line bg-surface p-4 print:border-0 print:p-0">
      <h2 className="mb-2 text-base font-semibold">
        {title} <span className="font-mono text-muted">({total})</span>
      </h2>
      {total === 0 ? <p className="text-sm text-muted">None.</p> : children}
      {total > shown ? <p className="mt-1 text-xs text-muted">… and {total - shown} more.</p> : null}
    </section>
  );
}

const th = "px-2 py-1 text-left text-xs font-medium uppercase tracking-wide text-muted";
const td = "px-2 py-1 align-top";
// Tables scroll inside their section on a phone instead of stretching the page; durations never break.
const idLink = (id: string, text: string) => (
  <Link href={`/candidates/${id}`} className="font-mono text-accent hover:underline print:text-fg">
    {text}
  </Link>
);

/** The end-of-shift summary as a page to read or print; the e-mail carries the same facts. */
export function HandoffView({ summary, timeZone }: { summary: HandoffSummary; timeZone: string }) {
  const { received, decisions, awaitingDecision, openTasks, missed } = summary;
  return (
    <div className="grid grid-cols-1 items-start gap-4 lg:grid-cols-2 print:block print:space-y-4">
      <Section title="Candidates received" total={received.total} shown={received.items.length}>
        <p className="mb-2 text-sm text-muted">
          {Object.entries(received.byClass).map(([k, n]) => `${n} ${cls(k === "pending" ? null : k)}`).join(" · ")}
        </p>
        <div className="relative overflow-x-auto"><table className="w-full text-sm">
          <thead><tr><th className={th}>Candidate</th><th className={th}>Received</th><th className={th}>Class</th><th className={th}>Now</th></tr></thead>
          <tbody>
            {received.items.map((c) => (
              <tr key={c.id} className="border-t border-line">
                <td className={td}>{idLink(c.id, c.externalId)}</td>
                <td className={td}><When ms={c.receivedAtMs} tz={timeZone} /></td>
                <td className={td}>{cls(c.dominantClass)}</td>
                <td className={td}>{state(c.triageState)}</td>
              </tr>
            ))}
          </tbody>
        </table></div>
      </Section>
      <Section title="Decisions taken" total={decisions.total} shown={decisions.items.length}>
        <p className="mb-2 text-sm text-muted">{Object.entries(decisions.byState).map(([k, n]) => `${n} ${state(k)}`).join(" · ")}</p>
        <div className="relative overflow-x-auto"><table className="w-full text-sm">
          <thead><tr><th className={th}>Candidate</th><th className={th}>Decision</th><th className={th}>When</th><th className={th}>By</th></tr></thead>
          <tbody>
            {decisions.items.map((d) => (
              <tr key={`${d.candidateId}-${d.atMs}`} className="border-t border-line">
                <td className={td}>{idLink(d.candidateId, d.externalId)}</td>
                <td className={td}>{state(d.toState)}</td>
                <td className={td}><When ms={d.atMs} tz={timeZone} /></td>
                <td className={td}>{d.actorName ?? "—"}</td>
              </tr>
            ))}
          </tbody>
        </table></div>
      </Section>
      <Section title="Awaiting a decision" total={awaitingDecision.total} shown={awaitingDecision.items.length}>
        <ul className="space-y-1 text-sm">
          {awaitingDecision.items.map((c) => (
            <li key={c.id}>{idLink(c.id, c.externalId)} — {state(c.triageState)}, received <When ms={c.receivedAtMs} tz={timeZone} /></li>
          ))}
        </ul>
      </Section>
      <Section title="Open follow-up tasks (now)" total={openTasks.total} shown={openTasks.items.length}>
        <div className="relative overflow-x-auto"><table className="w-full text-sm">
          <thead><tr><th className={th}>Candidate</th><th className={th}>Task</th><th className={th}>Site</th><th className={th}>State</th></tr></thead>
          <tbody>
            {openTasks.items.map((t) => (
              <tr key={t.id} className="border-t border-line">
                <td className={td}>{idLink(t.candidateId, t.externalId)}</td>
                <td className={td}>{taskKindLabels[t.kind as TaskKind] ?? t.kind} · P{t.priority}</td>
                <td className={td}>{t.siteCode ?? "any"}</td>
                <td className={td}>{taskStateLabels[t.state as TaskState] ?? t.state}{t.claimedByName ? ` (${t.claimedByName})` : ""}</td>
              </tr>
            ))}
          </tbody>
        </table></div>
      </Section>
      <div className="min-w-0 lg:col-span-2">
        <Section title="Deadlines missed" total={missed.total} shown={missed.items.length}>
          <p className="mb-2 text-sm text-muted">
            {Object.entries(missed.byStep).filter(([, n]) => n > 0).map(([s, n]) => `${n} ${steps[s as keyof typeof steps].label.toLowerCase()}`).join(" · ")}
          </p>
          <div className="relative overflow-x-auto"><table className="w-full text-sm">
            <thead><tr><th className={th}>Candidate</th><th className={th}>Step</th><th className={th}>Took</th><th className={th}>Deadline</th></tr></thead>
            <tbody>
              {missed.items.map((m) => (
                <tr key={`${m.candidateId}-${m.step}`} className="border-t border-line">
                  <td className={td}>{idLink(m.candidateId, m.externalId)}</td>
                  <td className={td}>{steps[m.step].label}</td>
                  <td className={`${td} whitespace-nowrap font-mono text-alarm`}>{formatDurationMs(m.durationMs)}{m.status === "open" ? " so far" : ""}</td>
                  <td className={`${td} whitespace-nowrap font-mono`}>{formatDurationMs(m.deadlineMs)}</td>
                </tr>
              ))}
            </tbody>
          </table></div>
        </Section>
      </div>
    </div>
  );
}
