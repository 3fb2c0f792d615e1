/**
 * The statements that store a new candidate, written by hand: the feed's hot path (lib/services/ingest-trigger.ts) and the
 * ingest benchmark's direct-insert baseline (bench/ingest-direct.ts) both use these, so the benchmark compares
 * like with like. Column encodings follow db/schema: instants as Unix ms, JSON columns as JSON text, ids as UUIDs.
 * Anything else (revisions of a known candidate, withdrawals, paging) goes through Drizzle.
 */
import type { InStatement } from "@libsql/client";
import { revisionHeadline, type DerivedHeadline } from "./headline";
import type { FeedCandidate } from "@/lib/validations/feed";

/**
 * The trigger for (source, externalId) and its candidate, if any, and the stored answer for this revision, if seen
 * before: `id` is the candidate's id, `trigger_id` the trigger's.
 */
export function lookupStatement(payload: Pick<FeedCandidate, "source" | "externalId" | "revision">): InStatement {
  return {
    sql:
      "select t.candidate_id as id, t.id as trigger_id, c.preferred_trigger_id, r.id as revision_id, d.derived from triggers t " +
      "join candidates c on c.id = t.candidate_id " +
      "left join candidate_revisions r on r.trigger_id = t.id and r.revision = ? " +
      "left join derived_quantities d on d.revision_id = r.id " +
      "where t.source = ? and t.external_id = ? limit 1",
    args: [payload.revision, payload.source, payload.externalId],
  };
}

export interface NewCandidateRow {
  candidateId: string;
  /** the trigger (source, externalId) this revision belongs to */
  triggerId: string;
  revisionId: string;
  payload: FeedCandidate;
  payloadJson: string;
  derivedJson: string;
  headline: DerivedHeadline;
  receivedAtMs: number;
}

export function insertCandidateStatement(row: NewCandidateRow): InStatement {
  const { payload, headline } = row;
  return {
    sql:
      "insert into candidates (id, preferred_trigger_id, source, external_id, current_revision, stage, triage_state, event_time, " +
      "received_at, updated_at, withdrawn_at, network_snr, false_alarm_rate_per_year, detectors, chirp_mass_detector_frame, " +
      "dominant_class) values (?, ?, ?, ?, ?, ?, 'new', ?, ?, ?, ?, ?, ?, ?, ?, ?)",
    args: [
      row.candidateId, row.triggerId, payload.source, payload.externalId, payload.revision, payload.stage, Date.parse(payload.eventTime),
      row.receivedAtMs, row.receivedAtMs, payload.stage === "withdrawn" ? row.receivedAtMs : null, payload.networkSnr,
      payload.falseAlarmRatePerYear, JSON.stringify(payload.detectors), headline.chirpMassDetectorFrame, headline.dominantClass,
    ],
  };
}

/** A new trigger of the candidate `row.candidateId` (new, or one it joins), its numbers from this first revision. */
export function insertTriggerStatement(row: NewCandidateRow): InStatement {
  const { payload, headline } = row;
  return {
    sql:
      "insert into triggers (id, candidate_id, source, external_id, current_revision, stage, event_time, received_at, updated_at, " +
      "withdrawn_at, network_snr, false_alarm_rate_per_year, detectors, chirp_mass_detector_frame, dominant_class) " +
      "values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
    args: [
      row.triggerId, row.candidateId, payload.source, payload.externalId, payload.revision, payload.stage, Date.parse(payload.eventTime),
      row.receivedAtMs, row.receivedAtMs, payload.stage === "withdrawn" ? row.receivedAtMs : null, payload.networkSnr,
      payload.falseAlarmRatePerYear, JSON.stringify(payload.detectors), headline.chirpMassDetectorFrame, headline.dominantClass,
    ],
  };
}

/** The small card the board needs, carried in the event so a live board draws it without another read. */
export function cardData(payload: FeedCandidate, headline: DerivedHeadline) {
  return { source: payload.source, externalId: payload.externalId, revision: payload.revision, ...revisionHeadline(payload, headline) };
}

/** What the created event carries: the card, in its first column. */
export function createdEventData(row: NewCandidateRow) {
  return { ...cardData(row.payload, row.headline), triageState: "new", receivedAt: new Date(row.receivedAtMs).toISOString() };
}

/** The event a live board draws the new card from; answers the event id. */
export function insertCreatedEventStatement(row: NewCandidateRow): InStatement {
  return {
    sql: "insert into events (at, kind, candidate_id, to_state, data) values (?, 'candidate.created', ?, 'new', ?) returning id",
    args: [row.receivedAtMs, row.candidateId, JSON.stringify(createdEventData(row))],
  };
}

export function insertRevisionStatement(row: NewCandidateRow): InStatement {
  const { payload } = row;
  return {
    sql:
      "insert into candidate_revisions (id, candidate_id, trigger_id, revision, stage, event_time, received_at, payload) " +
      "values (?, ?, ?, ?, ?, ?, ?, ?)",
    args: [row.revisionId, row.candidateId, row.triggerId, payload.revision, payload.stage, Date.parse(payload.eventTime), row.receivedAtMs, row.payloadJson],
  };
}

export function insertDerivedStatement(row: NewCandidateRow): InStatement {
  const { headline } = row;
  return {
    sql:
      "insert into derived_quantities (revision_id, chirp_mass_detector_frame, chirp_mass_detector_frame_sd, p_bns, p_nsbh, " +
      "p_bbh, p_lower_gap, redshift, derived, computed_at) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
    args: [
      row.revisionId, headline.chirpMassDetectorFrame, headline.chirpMassDetectorFrameSd, headline.pBns, headline.pNsbh,
      headline.pBbh, headline.pLowerGap, headline.redshift, row.derivedJson, row.receivedAtMs,
    ],
  };
}
