import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, idColumn, instant } from "./columns";
import { users } from "./users";

import { sourceClasses, stages, triageStates } from "./candidate-values";

export * from "./candidate-values";

/**
 * One signal. Its triggers (one per pipeline that reported it) are in `triggers`; the headline columns below are
 * copies of the preferred trigger's latest revision, and `receivedAt` is the first trigger's receipt.
 */
export const candidates = sqliteTable(
  "candidates",
  {
    id: idColumn(),
    /** the preferred trigger's source and id (copies, for lists and messages) */
    source: text("source").notNull(),
    externalId: text("external_id").notNull(),
    currentRevision: integer("current_revision").notNull(),
    stage: text("stage", { enum: stages }).notNull(),
    triageState: text("triage_state", { enum: triageStates }).notNull().default("new"),
    ownerId: text("owner_id").references(() => users.id, { onDelete: "set null" }),
    eventTime: instant("event_time").notNull(),
    receivedAt: instant("received_at").notNull(),
    updatedAt: instant("updated_at").notNull(),
    acknowledgedAt: instant("acknowledged_at"),
    acknowledgedById: text("acknowledged_by_id").references(() => users.id, { onDelete: "set null" }),
    decidedAt: instant("decided_at"),
    dismissReason: text("dismiss_reason"),
    withdrawnAt: instant("withdrawn_at"),
    // Copies of the current revision's headline numbers, for sorting and filtering lists.
    networkSnr: real("network_snr").notNull(),
    falseAlarmRatePerYear: real("false_alarm_rate_per_year").notNull(),
    detectors: text("detectors", { mode: "json" }).$type<string[]>().notNull(),
    chirpMassDetectorFrame: real("chirp_mass_detector_frame"),
    dominantClass: text("dominant_class", { enum: sourceClasses }),
    /** Bumped on every write, for optimistic concurrency. */
    version: integer("version").notNull().default(1),
    /** the trigger whose latest revision the headline columns copy (see lib/triggers/preferred.ts) */
    preferredTriggerId: text("preferred_trigger_id"),
    /** how many triggers (pipelines) reported this signal */
    triggerCount: integer("trigger_count").notNull().default(1),
    /** set when a coordinator merged this candidate into another; it then has no triggers and leaves the lists */
    mergedIntoId: text("merged_into_id"),
  },
  (t) => [
    index("candidates_source_external_idx").on(t.source, t.externalId),
    index("candidates_received_idx").on(t.receivedAt),
    index("candidates_triage_idx").on(t.triageState, t.receivedAt),
    index("candidates_event_time_idx").on(t.eventTime),
  ],
);
export type Candidate = typeof candidates.$inferSelect;
export type NewCandidate = typeof candidates.$inferInsert;

/**
 * One pipeline's report of a signal: (source, externalId) with its revisions. Its numbers copy its own latest
 * revision, so grouping and the preferred-trigger choice read one row per trigger.
 */
export const triggers = sqliteTable(
  "triggers",
  {
    id: idColumn(),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    source: text("source").notNull(),
    externalId: text("external_id").notNull(),
    currentRevision: integer("current_revision").notNull(),
    stage: text("stage", { enum: stages }).notNull(),
    eventTime: instant("event_time").notNull(),
    /** the first revision's receipt */
    receivedAt: instant("received_at").notNull(),
    updatedAt: instant("updated_at").notNull(),
    withdrawnAt: instant("withdrawn_at"),
    networkSnr: real("network_snr").notNull(),
    falseAlarmRatePerYear: real("false_alarm_rate_per_year").notNull(),
    detectors: text("detectors", { mode: "json" }).$type<string[]>().notNull(),
    chirpMassDetectorFrame: real("chirp_mass_detector_frame"),
    dominantClass: text("dominant_class", { enum: sourceClasses }),
  },
  (t) => [
    uniqueIndex("triggers_source_external_unique").on(t.source, t.externalId),
    index("triggers_event_time_idx").on(t.eventTime),
    index("triggers_candidate_idx").on(t.candidateId),
  ],
);
export type Trigger = typeof triggers.$inferSelect;

/** Every revision the feed sent, append-only, including ones that arrived out of order. */
export const candidateRevisions = sqliteTable(
  "candidate_revisions",
  {
    id: idColumn(),
    /** the candidate its trigger belongs to now (moved with the trigger on split and merge) */
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    /**
     * Always written by the app. Nullable in SQL only because SQLite adds a NOT NULL foreign-key column only by
     * rebuilding the table, and a rebuild under foreign_keys=ON would cascade-delete the derived quantities.
     */
    triggerId: text("trigger_id").references(() => triggers.id, { onDelete: "cascade" }),
    revision: integer("revision").notNull(),
    stage: text("stage", { enum: stages }).notNull(),
    eventTime: instant("event_time").notNull(),
    receivedAt: instant("received_at").notNull(),
    /** The validated feed payload as received. */
    payload: text("payload", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
  },
  (t) => [
    uniqueIndex("candidate_revisions_trigger_unique").on(t.triggerId, t.revision),
    index("candidate_revisions_candidate_idx").on(t.candidateId),
  ],
);
export type CandidateRevision = typeof candidateRevisions.$inferSelect;

/** Derived quantities for one revision: headline numbers as columns, the full result as JSON. */
export const derivedQuantities = sqliteTable("derived_quantities", {
  revisionId: text("revision_id")
    .primaryKey()
    .references(() => candidateRevisions.id, { onDelete: "cascade" }),
  chirpMassDetectorFrame: real("chirp_mass_detector_frame"),
  chirpMassDetectorFrameSd: real("chirp_mass_detector_frame_sd"),
  pBns: real("p_bns"),
  pNsbh: real("p_nsbh"),
  pBbh: real("p_bbh"),
  pLowerGap: real("p_lower_gap"),
  redshift: real("redshift"),
  derived: text("derived", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
  computedAt: instant("computed_at").notNull(),
});
export type DerivedQuantities = typeof derivedQuantities.$inferSelect;

export const candidateNotes = sqliteTable(
  "candidate_notes",
  {
    id: idColumn(),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    authorId: text("author_id")
      .notNull()
      .references(() => users.id),
    body: text("body").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("candidate_notes_candidate_idx").on(t.candidateId, t.createdAt)],
);

/** Feed posts that passed the signature but were refused, kept raw for coordinators. */
export const deadLetters = sqliteTable(
  "dead_letters",
  {
    id: idColumn(),
    receivedAt: instant("received_at").notNull(),
    statusCode: integer("status_code").notNull(),
    reason: text("reason").notNull(),
    issues: text("issues", { mode: "json" }).$type<Array<{ path: string; message: string }>>(),
    rawBody: text("raw_body").notNull(),
    source: text("source"),
    externalId: text("external_id"),
  },
  (t) => [index("dead_letters_received_idx").on(t.receivedAt)],
);
