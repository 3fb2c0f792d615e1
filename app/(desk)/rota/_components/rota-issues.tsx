import { CircleCheck, CircleSlash, Layers } from "lucide-react";
import { dayClock } from "@/lib/notify/rota-week";
import type { RotaIssueJson, ShiftView } from "./types";

function names(issue: Extract<RotaIssueJson, { kind: "overlap" }>, shifts: ShiftView[]): string {
  return issue.shiftIds.map((id) => shifts.find((s) => s.id === id)?.primary.name ?? "?").join(" and ");
}

/** Overlaps and gaps in the shown week, in words and with an icon each (never colour alone). */
export function RotaIssues({ issues, shifts, timeZone }: { issues: RotaIssueJson[]; shifts: ShiftView[]; timeZone: string }) {
  if (issues.length === 0) {
    return (
      <p className="flex items-center gap-2 text-sm text-ok" data-testid="rota-issues">
        <CircleCheck aria-hidden className="h-4 w-4" /> Every hour of this week has exactly one primary on call.
      </p>
    );
  }
  return (
    <ul className="space-y-1 text-sm" data-testid="rota-issues">
      {issues.map((issue) => {
        const span = `${dayClock(Date.parse(issue.from), timeZone)} – ${dayClock(Date.parse(issue.to), timeZone)}`;
        return issue.kind === "gap" ? (
          <li key={`gap-${issue.from}`} className="flex items-start gap-2 text-alarm">
            <CircleSlash aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
            <span>
              <strong>Gap</strong> {span}: nobody is on call; new candidates page the coordinators directly.
            </span>
          </li>
        ) : (
          <li key={`overlap-${issue.shiftIds.join("-")}`} className="flex items-start gap-2 text-warn">
            <Layers aria-hidden className="mt-0.5 h-4 w-4 shrink-0" />
            <span>
              <strong>Overlap</strong> {span}: shifts of {names(issue, shifts)}; the later shift&apos;s primary is paged.
            </span>
          </li>
        );
      })}
    </ul>
  );
}
