import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { candidates } from "./candidates";
import { createdAt, idColumn, instant } from "./columns";
import { sites } from "./sites";
import { taskKinds, taskStates } from "./task-values";
import { users } from "./users";

export * from "./task-values";

export const followUpTasks = sqliteTable(
  "follow_up_tasks",
  {
    id: idColumn(),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: taskKinds }).notNull(),
    siteId: text("site_id").references(() => sites.id, { onDelete: "set null" }),
    windowStart: instant("window_start"),
    windowEnd: instant("window_end"),
    priority: integer("priority").notNull().default(2),
    notes: text("notes").notNull().default(""),
    state: text("state", { enum: taskStates }).notNull().default("open"),
    claimedById: text("claimed_by_id").references(() => users.id, { onDelete: "set null" }),
    claimedAt: instant("claimed_at"),
    observingAt: instant("observing_at"),
    reportedAt: instant("reported_at"),
    cancelledAt: instant("cancelled_at"),
    result: text("result"),
    createdById: text("created_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: instant("updated_at").notNull(),
    version: integer("version").notNull().default(1),
  },
  (t) => [
    index("follow_up_tasks_candidate_idx").on(t.candidateId),
    index("follow_up_tasks_state_idx").on(t.state, t.createdAt),
    index("follow_up_tasks_site_idx").on(t.siteId),
    index("follow_up_tasks_claimed_by_idx").on(t.claimedById),
  ],
);
export type FollowUpTask = typeof followUpTasks.$inferSelect;
export type NewFollowUpTask = typeof followUpTasks.$inferInsert;
