import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, idColumn, instant } from "./columns";
import { users } from "./users";

export const shifts = sqliteTable(
  "shifts",
  {
    id: idColumn(),
    startsAt: instant("starts_at").notNull(),
    endsAt: instant("ends_at").notNull(),
    primaryId: text("primary_id")
      .notNull()
      .references(() => users.id),
    backupId: text("backup_id").references(() => users.id),
    notes: text("notes").notNull().default(""),
    /** set by the worker when the end-of-shift handoff was queued */
    handoffQueuedAt: instant("handoff_queued_at"),
    createdAt: createdAt(),
  },
  (t) => [index("shifts_range_idx").on(t.startsAt, t.endsAt)],
);
export type Shift = typeof shifts.$inferSelect;
export type NewShift = typeof shifts.$inferInsert;

export const channels = ["push", "email", "in-app"] as const;
export type Channel = (typeof channels)[number];

export const notificationStatuses = ["pending", "sending", "sent", "failed", "cancelled", "skipped"] as const;
export type NotificationStatus = (typeof notificationStatuses)[number];

/** The outbox: written in the same transaction as the event that caused it, sent by the worker. */
export const notifications = sqliteTable(
  "notifications",
  {
    id: idColumn(),
    /** one row per (event, recipient, channel) */
    dedupeKey: text("dedupe_key").notNull(),
    eventId: integer("event_id"),
    userId: text("user_id").references(() => users.id, { onDelete: "cascade" }),
    /** for addresses outside the user table, e.g. a coordinators' list */
    address: text("address"),
    channel: text("channel", { enum: channels }).notNull(),
    kind: text("kind").notNull(),
    candidateId: text("candidate_id"),
    taskId: text("task_id"),
    title: text("title").notNull(),
    body: text("body").notNull(),
    url: text("url"),
    payload: text("payload", { mode: "json" }).$type<Record<string, unknown>>(),
    status: text("status", { enum: notificationStatuses }).notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: instant("next_attempt_at").notNull(),
    lockedBy: text("locked_by"),
    lockedUntil: instant("locked_until"),
    lastError: text("last_error"),
    sentAt: instant("sent_at"),
    readAt: instant("read_at"),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("notifications_dedupe_unique").on(t.dedupeKey),
    index("notifications_due_idx").on(t.status, t.nextAttemptAt),
    index("notifications_user_idx").on(t.userId, t.createdAt),
    index("notifications_candidate_idx").on(t.candidateId),
  ],
);
export type Notification = typeof notifications.$inferSelect;
export type NewNotification = typeof notifications.$inferInsert;

/** Escalation timers are rows, so a restarted worker loses none. */
export const escalations = sqliteTable(
  "escalations",
  {
    id: idColumn(),
    candidateId: text("candidate_id").notNull(),
    step: integer("step").notNull(),
    /** "backup" | "coordinators" | … */
    target: text("target").notNull(),
    dueAt: instant("due_at").notNull(),
    status: text("status", { enum: ["pending", "fired", "cancelled"] }).notNull().default("pending"),
    firedAt: instant("fired_at"),
    lockedBy: text("locked_by"),
    lockedUntil: instant("locked_until"),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("escalations_candidate_step_unique").on(t.candidateId, t.step),
    index("escalations_due_idx").on(t.status, t.dueAt),
  ],
);
export type Escalation = typeof escalations.$inferSelect;

export const pushSubscriptions = sqliteTable(
  "push_subscriptions",
  {
    id: idColumn(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    endpoint: text("endpoint").notNull(),
    p256dh: text("p256dh").notNull(),
    auth: text("auth").notNull(),
    label: text("label").notNull().default(""),
    createdAt: createdAt(),
    lastSuccessAt: instant("last_success_at"),
  },
  (t) => [uniqueIndex("push_subscriptions_endpoint_unique").on(t.endpoint), index("push_subscriptions_user_idx").on(t.userId)],
);
export type PushSubscriptionRow = typeof pushSubscriptions.$inferSelect;

export interface PagingPreferences {
  push: boolean;
  email: boolean;
  /** local "HH:mm" in the user's time zone; null = no quiet hours */
  quietStart: string | null;
  quietEnd: string | null;
  /** sites whose follow-up tasks the user wants to hear about */
  taskSiteIds: string[];
  taskChannels: { push: boolean; email: boolean };
}

export const notificationPreferences = sqliteTable("notification_preferences", {
  userId: text("user_id")
    .primaryKey()
    .references(() => users.id, { onDelete: "cascade" }),
  preferences: text("preferences", { mode: "json" }).$type<PagingPreferences>().notNull(),
  updatedAt: instant("updated_at").notNull(),
});

/** One-click acknowledge links: single use, expiring, signed; this row records the use. */
export const ackTokens = sqliteTable("ack_tokens", {
  id: text("id").primaryKey(),
  candidateId: text("candidate_id").notNull(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  expiresAt: instant("expires_at").notNull(),
  usedAt: instant("used_at"),
  createdAt: createdAt(),
});
