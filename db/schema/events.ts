import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { instant } from "./columns";
import { users } from "./users";

/**
 * The append-only audit and event log: who did what, when, from which state to which.
 * Its integer id orders the live stream and is the resume point of `/api/v1/events`.
 */
export const events = sqliteTable(
  "events",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    at: instant("at").notNull(),
    /** null when the system or the feed acted */
    actorId: text("actor_id").references(() => users.id, { onDelete: "set null" }),
    kind: text("kind").notNull(),
    candidateId: text("candidate_id"),
    taskId: text("task_id"),
    fromState: text("from_state"),
    toState: text("to_state"),
    data: text("data", { mode: "json" }).$type<Record<string, unknown>>(),
  },
  (t) => [
    index("events_candidate_idx").on(t.candidateId, t.id),
    // The response-time review's first-milestone seeks (lib/data/review.ts): covers every column they read.
    index("events_candidate_kind_idx").on(t.candidateId, t.kind, t.at, t.toState, t.fromState, t.actorId, t.taskId),
    index("events_task_idx").on(t.taskId),
    index("events_kind_at_idx").on(t.kind, t.at),
    index("events_at_idx").on(t.at),
  ],
);
export type AppEvent = typeof events.$inferSelect;
export type NewAppEvent = typeof events.$inferInsert;
