"use client";

import { useMemo, useState } from "react";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { roleLabels } from "@/lib/auth/roles";
import { formatClock, formatInZone } from "@/lib/format/time";
import type { ReviewReport } from "@/lib/review/report";
import { steps, type StepId } from "@/lib/review/steps";
import { CoverageCurves } from "./coverage-curves";
import { DistributionChart } from "./distribution-chart";
import { GroupTable, type GroupRowView } from "./group-table";
import { StepCandidatesDialog, type ListingSpec } from "./step-candidates-dialog";
import { StepTable } from "./step-table";
import { TrendChart } from "./trend-chart";

const latestFirst = [{ id: "sortLabel", desc: true }];

/** The interactive part of the review page: step picker, charts, sortable tables, click-through lists. */
export function ReviewView({ report, filterQuery }: { report: ReviewReport; filterQuery: string }) {
  const [step, setStep] = useState<StepId>("acknowledge");
  const [listing, setListing] = useState<ListingSpec | null>(null);
  const [groupBy, setGroupBy] = useState<"shift" | "person">("shift");
  const tz = report.timeZone;

  const shiftRows = useMemo<GroupRowView[]>(
    () =>
      report.shifts.map((s) => ({
        id: s.id,
        sortLabel: new Date(s.startsAtMs).toISOString(),
        label: (
          <a href={`/review/handoff/${s.id}`} className="hover:text-accent hover:underline" title="Printable handoff summary">
            {formatInZone(s.startsAtMs, tz).slice(0, 16)} – {formatClock(s.endsAtMs, tz)}
          </a>
        ),
        detail: `${s.primaryName}${s.backupName ? `, backup ${s.backupName}` : ""}`,
        candidates: s.candidates,
        figures: s.steps[step],
      })),
    [report.shifts, step, tz],
  );
  const personRows = useMemo<GroupRowView[]>(
    () =>
      report.people
        .filter((p) => p.steps[step].count > 0)
        .map((p) => ({
          id: p.id,
          sortLabel: p.name,
          label: p.name,
          detail: p.role in roleLabels ? roleLabels[p.role as keyof typeof roleLabels] : p.role,
          candidates: p.candidates,
          figures: p.steps[step],
        })),
    [report.people, step],
  );
  const personal = step === "acknowledge" || step === "decide" || step === "claim" || step === "report" || step === "exposure";

  return (
    <div className="space-y-4">
      <StepTable
        figures={report.steps}
        deadlinesMs={report.deadlinesMs}
        selected={step}
        onSelect={setStep}
        onListLate={(s) => setListing({ step: s, late: true, title: `${steps[s].label}: over the deadline` })}
      />
      <div className="grid gap-4 xl:grid-cols-2">
        <Panel>
          <PanelTitle>{steps[step].label}: how long it took</PanelTitle>
          <DistributionChart
            bins={report.histograms[step]}
            deadlineMs={report.deadlinesMs[step]}
            onPick={(bin) => setListing({ step, bin: bin.key, title: `${steps[step].label}: ${bin.label}` })}
          />
        </Panel>
        <Panel>
          <PanelTitle>{steps[step].label}: week by week</PanelTitle>
          <TrendChart
            trend={report.trend}
            step={step}
            deadlineMs={report.deadlinesMs[step]}
            timeZone={tz}
            onPickWeek={(week) => setListing({ step, week, late: true, title: `${steps[step].label}: late in the week of ${formatInZone(week, tz).slice(0, 10)}` })}
          />
        </Panel>
      </div>
      <Panel>
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          <PanelTitle className="mb-0">{steps[step].label} by {groupBy === "shift" ? "shift" : "person"}</PanelTitle>
          <div role="group" aria-label="Group by" className="inline-flex rounded-md border border-line p-0.5 text-sm">
            {(["shift", "person"] as const).map((g) => (
              <button
                key={g}
                type="button"
                aria-pressed={groupBy === g}
                onClick={() => setGroupBy(g)}
                className={groupBy === g ? "rounded bg-accent/15 px-3 py-1 font-medium text-fg" : "px-3 py-1 text-muted hover:text-fg"}
              >
                {g === "shift" ? "By shift" : "By person"}
              </button>
            ))}
          </div>
        </div>
        {groupBy === "person" && !personal ? (
          <p className="mb-2 text-xs text-muted">{steps[step].label} is the system&apos;s step, not a person&apos;s: pick acknowledgement, decision, claim, report or first exposure to compare people.</p>
        ) : null}
        {groupBy === "shift" ? (
          <GroupTable rows={shiftRows} firstHeader="Shift" caption="Figures per shift, by receipt time" initialSort={latestFirst} />
        ) : (
          <GroupTable rows={personRows} firstHeader="Person" caption="Figures per person, over the steps they finished" />
        )}
      </Panel>
      <Panel>
        <PanelTitle>Observed probability against time since merger</PanelTitle>
        <CoverageCurves curves={report.curves} />
      </Panel>
      <StepCandidatesDialog spec={listing} filterQuery={filterQuery} timeZone={tz} onClose={() => setListing(null)} />
    </div>
  );
}
