import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { candidates } from "./candidates";
import { createdAt, idColumn, instant } from "./columns";
import { instruments, type Footprint } from "./instruments";
import { sites } from "./sites";
import { followUpTasks } from "./tasks";
import { skymaps } from "./uploads";
import { users } from "./users";

/** Which sky a new plan leaves out: other open plans' footprints and observed ones, only observed ones, or none. */
export const planAvoidModes = ["planned-and-observed", "observed", "none"] as const;
export type PlanAvoidMode = (typeof planAvoidModes)[number];

export const unscheduledReasons = ["not-observable-in-window", "too-close-to-moon", "no-time-left"] as const;

/**
 * A pointing plan: one instrument's numbered tiles over one sky map's credible region, scheduled in a window.
 * The instrument's footprint, exposure and overhead are copied in, so editing or deleting the instrument later
 * leaves the plan as it was made. A plan is open until `closedAt` (its task was cancelled).
 */
export const plans = sqliteTable(
  "plans",
  {
    id: idColumn(),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    skymapId: text("skymap_id")
      .notNull()
      .references(() => skymaps.id, { onDelete: "cascade" }),
    instrumentId: text("instrument_id").references(() => instruments.id, { onDelete: "set null" }),
    siteId: text("site_id").references(() => sites.id, { onDelete: "set null" }),
    taskId: text("task_id").references(() => followUpTasks.id, { onDelete: "set null" }),
    instrumentName: text("instrument_name").notNull(),
    footprint: text("footprint", { mode: "json" }).$type<Footprint>().notNull(),
    exposureS: integer("exposure_s").notNull(),
    overheadS: integer("overhead_s").notNull(),
    filter: text("filter"),
    level: real("level").notNull(),
    maxPointings: integer("max_pointings").notNull(),
    avoid: text("avoid", { enum: planAvoidModes }).notNull(),
    moonDistanceDeg: real("moon_distance_deg").notNull(),
    windowStart: instant("window_start").notNull(),
    windowEnd: instant("window_end").notNull(),
    totalProbability: real("total_probability").notNull(),
    scheduledProbability: real("scheduled_probability").notNull(),
    /** Probability already inside the avoided footprints when the plan was made. */
    avoidedProbability: real("avoided_probability").notNull(),
    createdById: text("created_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    closedAt: instant("closed_at"),
  },
  (t) => [
    index("plans_candidate_idx").on(t.candidateId, t.createdAt),
    index("plans_task_idx").on(t.taskId),
    index("plans_site_idx").on(t.siteId),
  ],
);
export type Plan = typeof plans.$inferSelect;
export type NewPlan = typeof plans.$inferInsert;

/** One numbered tile of a plan, with its planned time (null with a reason when it does not fit) and its tick. */
export const planPointings = sqliteTable(
  "plan_pointings",
  {
    id: idColumn(),
    planId: text("plan_id")
      .notNull()
      .references(() => plans.id, { onDelete: "cascade" }),
    /** 1-based, in the order the planner chose the tiles (most probability first). */
    index: integer("index").notNull(),
    raDeg: real("ra_deg").notNull(),
    decDeg: real("dec_deg").notNull(),
    probability: real("probability").notNull(),
    gainedProbability: real("gained_probability").notNull(),
    cumulativeProbability: real("cumulative_probability").notNull(),
    plannedStart: instant("planned_start"),
    plannedEnd: instant("planned_end"),
    altitudeDeg: real("altitude_deg"),
    airmass: real("airmass"),
    moonSeparationDeg: real("moon_separation_deg"),
    unscheduledReason: text("unscheduled_reason", { enum: unscheduledReasons }),
    doneAt: instant("done_at"),
    doneById: text("done_by_id").references(() => users.id, { onDelete: "set null" }),
  },
  (t) => [uniqueIndex("plan_pointings_plan_index_unique").on(t.planId, t.index)],
);
export type PlanPointing = typeof planPointings.$inferSelect;
export type NewPlanPointing = typeof planPointings.$inferInsert;
