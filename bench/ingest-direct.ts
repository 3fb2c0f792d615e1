/**
 * The baseline for bench/ingest.ts: the rows the feed route writes for a new candidate, written straight through
 * the libSQL client with the same statements and one write transaction each, derived quantities precomputed.
 */
import { randomUUID } from "node:crypto";
import type { Client } from "@libsql/client";
import type { FeedPost } from "@/fakes/feed/generator";
import { headlineFromDerived, type DerivedHeadline } from "@/lib/feed/headline";
import { derivationSeed, toPhysicsInput } from "@/lib/feed/physics-input";
import { computeDerived, defaultPhysicsSettings } from "@/lib/physics";
import { feedCandidateSchema, type FeedCandidate } from "@/lib/validations/feed";

export interface DirectRow {
  payload: FeedCandidate;
  payloadJson: string;
  derivedJson: string;
  headline: DerivedHeadline;
  receivedAtMs: number;
}

export async function precomputeRows(posts: FeedPost[]): Promise<DirectRow[]> {
  const receivedAtMs = Date.now();
  return posts.map((post) => {
    const payload = feedCandidateSchema.parse(JSON.parse(post.rawBody));
    const derived = computeDerived(toPhysicsInput(payload, new Date(receivedAtMs)), defaultPhysicsSettings, derivationSeed(payload));
    return {
      payload,
      payloadJson: JSON.stringify(payload),
      derivedJson: JSON.stringify(derived),
      headline: headlineFromDerived(derived),
      receivedAtMs,
    };
  });
}

const storedAnswerSql =
  "select c.id, d.derived from candidates c join candidate_revisions r on r.candidate_id = c.id and r.revision = ? " +
  "left join derived_quantities d on d.revision_id = r.id where c.source = ? and c.external_id = ? limit 1";

/** Milliseconds to write every row, sequentially, as the route does for a new candidate. */
export async function insertDirect(client: Client, rows: DirectRow[]): Promise<number> {
  const started = performance.now();
  for (const row of rows) {
    const { payload, headline } = row;
    const eventTimeMs = Date.parse(payload.eventTime);
    const lookup = { sql: storedAnswerSql, args: [payload.revision, payload.source, payload.externalId] };
    await client.execute(lookup);
    await client.execute({ sql: "select value from settings where key = ? limit 1", args: ["physics"] });
    const tx = await client.transaction("write");
    try {
      await tx.execute(lookup);
      await tx.execute({
        sql: "select * from candidates where source = ? and external_id = ? limit 1",
        args: [payload.source, payload.externalId],
      });
      const candidateId = randomUUID();
      await tx.execute({
        sql:
          "insert into candidates (id, source, external_id, current_revision, stage, triage_state, event_time, received_at, " +
          "updated_at, withdrawn_at, network_snr, false_alarm_rate_per_year, detectors, chirp_mass_detector_frame, dominant_class) " +
          "values (?, ?, ?, ?, ?, 'new', ?, ?, ?, null, ?, ?, ?, ?, ?)",
        args: [
          candidateId, payload.source, payload.externalId, payload.revision, payload.stage, eventTimeMs, row.receivedAtMs,
          row.receivedAtMs, payload.networkSnr, payload.falseAlarmRatePerYear, JSON.stringify(payload.detectors),
          headline.chirpMassDetectorFrame, headline.dominantClass,
        ],
      });
      await tx.execute({
        sql: "insert into events (at, kind, candidate_id, to_state, data) values (?, 'candidate.created', ?, 'new', ?)",
        args: [row.receivedAtMs, candidateId, JSON.stringify({ externalId: payload.externalId, stage: payload.stage })],
      });
      const revisionId = randomUUID();
      await tx.execute({
        sql: "insert into candidate_revisions (id, candidate_id, revision, stage, event_time, received_at, payload) values (?, ?, ?, ?, ?, ?, ?)",
        args: [revisionId, candidateId, payload.revision, payload.stage, eventTimeMs, row.receivedAtMs, row.payloadJson],
      });
      await tx.execute({
        sql:
          "insert into derived_quantities (revision_id, chirp_mass_detector_frame, chirp_mass_detector_frame_sd, p_bns, p_nsbh, " +
          "p_bbh, p_lower_gap, redshift, derived, computed_at) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
        args: [
          revisionId, headline.chirpMassDetectorFrame, headline.chirpMassDetectorFrameSd, headline.pBns, headline.pNsbh,
          headline.pBbh, headline.pLowerGap, headline.redshift, row.derivedJson, row.receivedAtMs,
        ],
      });
      await tx.commit();
    } finally {
      tx.close();
    }
  }
  return performance.now() - started;
}
