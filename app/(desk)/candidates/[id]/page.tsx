import { Ban } from "lucide-react";
import Link from "next/link";
import { notFound } from "next/navigation";
import { cache } from "react";
import { AuditLog } from "@/components/candidate/audit-log";
import { CandidateLiveRefresh } from "@/components/candidate/candidate-live-refresh";
import { CandidateTriagePanel } from "@/components/candidate/candidate-triage-panel";
import { Caution } from "@/components/candidate/caution";
import { KeyNumbers } from "@/components/candidate/key-numbers";
import { MergerPanel } from "@/components/candidate/merger-panel";
import { NotesThread } from "@/components/candidate/notes-thread";
import { RevisionTimeline } from "@/components/candidate/revision-timeline";
import { SkymapSlot } from "@/components/candidate/skymap-slot";
import { SourceClassPanel } from "@/components/candidate/source-class-panel";
import { StageBadge } from "@/components/candidate/stage-badge";
import { TasksPanel } from "@/components/candidate/tasks-panel";
import { CandidatePlansPanel } from "@/components/plans/candidate-plans-panel";
import { trackSeries } from "@/components/candidate/track-data";
import { TrackPlot } from "@/components/candidate/track-plot";
import { MergedNotice, TriggersPanel } from "@/components/candidate/triggers-panel";
import { CounterpartsPanel } from "@/components/observations/counterparts-panel";
import { CoveragePanel } from "@/components/observations/coverage-panel";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { getCandidateDetail } from "@/lib/data/candidate-detail";
import { listCandidateAudit, listNotes, loadPeople } from "@/lib/data/candidates";
import { listSiteOptions } from "@/lib/data/tasks";
import { listNearbyCandidates } from "@/lib/data/triggers";
import { formatInZone } from "@/lib/format/time";
import type { Derived } from "@/lib/physics/derived-types";
import { getCandidatePlans, getPlanInstrumentOptions } from "@/lib/services/read-plans";

export const dynamic = "force-dynamic";

/** Candidates a coordinator is offered to merge: event times within ten minutes of this one's. */
const mergeSpanMs = 10 * 60_000;

// The title and the page read the same candidate: once per request.
const readDetail = cache(getCandidateDetail);

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }) {
  const detail = await readDetail((await params).id);
  return { title: detail ? `Candidate ${detail.externalId}` : "Candidate not found" };
}

export default async function CandidatePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageUser();
  const { id } = await params;
  const detail = await readDetail(id);
  if (!detail) notFound();
  const canRegroup = hasRole(user, can.regroupTriggers) && detail.mergedIntoId === null;
  const canPlanPointings = hasRole(user, can.planPointings);
  const [audit, notes, sites, nearby, plans, planInstruments] = await Promise.all([
    listCandidateAudit(id),
    listNotes(id),
    listSiteOptions(),
    canRegroup ? listNearbyCandidates(id, detail.state.eventTime, mergeSpanMs) : Promise.resolve([]),
    getCandidatePlans(id),
    canPlanPointings ? getPlanInstrumentOptions(user) : Promise.resolve([]),
  ]);
  const people = await loadPeople(audit.map((e) => (typeof e.data?.ownerId === "string" ? e.data.ownerId : null)));
  // The stored derived JSON has the Derived shape (lib/physics); every block may be null, so it is read defensively.
  const derived = detail.derived as Partial<Derived>;
  const withdrawn = detail.state.stage === "withdrawn" || detail.state.withdrawnAt !== null;
  const series = trackSeries(derived.plot, detail.payload.frequencyTrack);
  const tz = user.timeZone;
  return (
    <div className="space-y-4" data-testid="candidate-page">
      <CandidateLiveRefresh candidateId={detail.id} />
      <header className="flex flex-wrap items-center gap-3">
        <Link href="/candidates" className="text-sm text-muted hover:text-fg">
          Candidates /
        </Link>
        <h1 className="font-mono text-xl font-semibold">{detail.externalId}</h1>
        <StageBadge stage={detail.state.stage} />
        <span className="text-sm text-muted">
          revision {detail.revision} · from {detail.source}
        </span>
      </header>
      {withdrawn ? (
        <p role="alert" className="flex items-center gap-2 rounded-md border border-alarm/50 bg-alarm/10 px-3 py-2 text-sm">
          <Ban aria-hidden className="h-4 w-4 text-alarm" />
          <span>
            <strong>Withdrawn by the feed</strong>
            {detail.state.withdrawnAt ? ` at ${formatInZone(detail.state.withdrawnAt, tz)}` : ""}. Its open follow-up tasks were cancelled.
          </span>
        </p>
      ) : null}
      {detail.mergedIntoId ? <MergedNotice intoId={detail.mergedIntoId} /> : null}
      <Caution />
      {/* Two columns from xl. Below it one column in source order: the figures and the sky, then triage, class
          and tasks, and the history last (a phone at the telescope should not scroll past the audit log). */}
      <div className="grid grid-cols-[minmax(0,1fr)] gap-4 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)] xl:grid-rows-[auto_1fr]">
        <div className="space-y-4 xl:col-start-1 xl:row-start-1">
          <Panel>
            <PanelTitle>Key numbers</PanelTitle>
            <KeyNumbers detail={detail} derived={derived} timeZone={tz} />
          </Panel>
          {detail.triggers.length > 0 ? (
            <Panel>
              <PanelTitle>Triggers</PanelTitle>
              <TriggersPanel
                candidateId={detail.id}
                timeZone={tz}
                canRegroup={canRegroup}
                rows={detail.triggers.map((t) => ({
                  id: t.id,
                  source: t.source,
                  externalId: t.externalId,
                  revision: t.revision,
                  preferred: t.preferred,
                  stage: t.stage,
                  withdrawn: t.withdrawnAt !== null,
                  eventTimeMs: t.eventTime.getTime(),
                  receivedAtMs: t.receivedAt.getTime(),
                  networkSnr: t.networkSnr,
                  falseAlarmRatePerYear: t.falseAlarmRatePerYear,
                  chirpMassDetectorFrame: t.chirpMassDetectorFrame,
                  detectors: t.detectors,
                }))}
                mergeOptions={nearby.map((c) => ({
                  id: c.id,
                  externalId: c.externalId,
                  source: c.source,
                  triggerCount: c.triggerCount,
                  offsetS: (c.eventTime.getTime() - detail.state.eventTime.getTime()) / 1000,
                }))}
              />
            </Panel>
          ) : null}
          <Panel>
            <PanelTitle>Frequency track and fitted chirp</PanelTitle>
            <TrackPlot series={series} />
          </Panel>
          <SkymapSlot candidateId={detail.id} revision={detail.revision} timeZone={tz} />
          <Panel>
            <PanelTitle>Pointing plans</PanelTitle>
            <CandidatePlansPanel candidateId={detail.id} initialPlans={plans} instruments={planInstruments} canPlan={canPlanPointings && !withdrawn} timeZone={tz} />
          </Panel>
          <CoveragePanel candidateId={detail.id} sites={sites} timeZone={tz} />
          <CounterpartsPanel candidateId={detail.id} canReport={hasRole(user, can.reportCounterparts)} timeZone={tz} />
        </div>
        <div className="space-y-4 xl:col-start-2 xl:row-span-2 xl:row-start-1">
          <Panel>
            <PanelTitle>Triage</PanelTitle>
            <CandidateTriagePanel
              state={{
                id: detail.id,
                externalId: detail.externalId,
                triageState: detail.state.triageState,
                version: detail.state.version,
                withdrawn,
                owner: detail.state.owner,
                acknowledgedAt: detail.state.acknowledgedAt?.getTime() ?? null,
                acknowledgedBy: detail.state.acknowledgedBy?.name ?? null,
                decidedAt: detail.state.decidedAt?.getTime() ?? null,
                dismissReason: detail.state.dismissReason,
              }}
              canTriage={hasRole(user, can.triage)}
              canPlan={hasRole(user, can.planFollowUp)}
              sites={sites}
              timeZone={tz}
            />
          </Panel>
          <Panel>
            <PanelTitle>Source class</PanelTitle>
            <SourceClassPanel derived={derived} />
          </Panel>
          <Panel>
            <PanelTitle>Merger and ringdown</PanelTitle>
            <MergerPanel derived={derived} />
          </Panel>
          <Panel>
            <PanelTitle>Follow-up tasks</PanelTitle>
            <TasksPanel candidateId={detail.id} tasks={detail.tasks} timeZone={tz} canRecord={hasRole(user, can.recordObservations)} />
          </Panel>
          <Panel>
            <PanelTitle>Notes</PanelTitle>
            <NotesThread candidateId={detail.id} initialNotes={notes} timeZone={tz} />
          </Panel>
        </div>
        <div className="space-y-4 xl:col-start-1 xl:row-start-2">
          <Panel>
            <PanelTitle>Revisions</PanelTitle>
            <RevisionTimeline revisions={detail.revisions} timeZone={tz} />
          </Panel>
          <Panel>
            <PanelTitle>Audit log</PanelTitle>
            <AuditLog entries={audit} people={people} timeZone={tz} candidateId={detail.id} />
          </Panel>
        </div>
      </div>
    </div>
  );
}
