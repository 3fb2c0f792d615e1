import { index, integer, real, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { candidates } from "./candidates";
import { createdAt, idColumn, instant } from "./columns";
import { instruments, type Footprint } from "./instruments";
import { sites } from "./sites";
import { followUpTasks } from "./tasks";
import { users } from "./users";

/** How an observation reached us: the JSON API, a CSV upload, or a ticked planned pointing. */
export const observationSources = ["api", "csv", "tick"] as const;
export type ObservationSource = (typeof observationSources)[number];

/**
 * One exposure a telescope took for a candidate. The footprint is stored resolved (the instrument's when the row
 * gave none), and the site copied from the instrument or the task, so coverage never depends on an instrument
 * that was edited or deleted later.
 */
export const observations = sqliteTable(
  "observations",
  {
    id: idColumn(),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    taskId: text("task_id").references(() => followUpTasks.id, { onDelete: "set null" }),
    instrumentId: text("instrument_id").references(() => instruments.id, { onDelete: "set null" }),
    siteId: text("site_id").references(() => sites.id, { onDelete: "set null" }),
    raDeg: real("ra_deg").notNull(),
    decDeg: real("dec_deg").notNull(),
    footprint: text("footprint", { mode: "json" }).$type<Footprint>().notNull(),
    startTime: instant("start_time").notNull(),
    exposureS: real("exposure_s").notNull(),
    filter: text("filter").notNull(),
    limitingMagnitude: real("limiting_magnitude"),
    pointingIndex: integer("pointing_index"),
    source: text("source", { enum: observationSources }).notNull(),
    recordedById: text("recorded_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [
    index("observations_candidate_idx").on(t.candidateId, t.startTime),
    index("observations_task_idx").on(t.taskId),
  ],
);
export type Observation = typeof observations.$inferSelect;
export type NewObservation = typeof observations.$inferInsert;

/**
 * A transient someone found while following a candidate up. Searched probability and area are not stored: they
 * are computed on the candidate's newest sky map when read, so a new revision's map re-ranks every counterpart.
 */
export const counterparts = sqliteTable(
  "counterparts",
  {
    id: idColumn(),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    raDeg: real("ra_deg").notNull(),
    decDeg: real("dec_deg").notNull(),
    observedAt: instant("observed_at").notNull(),
    magnitude: real("magnitude"),
    magnitudeError: real("magnitude_error"),
    filter: text("filter"),
    name: text("name"),
    notes: text("notes").notNull(),
    reportedById: text("reported_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("counterparts_candidate_idx").on(t.candidateId, t.observedAt)],
);
export type Counterpart = typeof counterparts.$inferSelect;
export type NewCounterpart = typeof counterparts.$inferInsert;
