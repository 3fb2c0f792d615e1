import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, idColumn, instant } from "./columns";

import { roles } from "./roles";

export { roles, type Role } from "./roles";

export const users = sqliteTable(
  "users",
  {
    id: idColumn(),
    email: text("email").notNull(),
    name: text("name").notNull(),
    passwordHash: text("password_hash").notNull(),
    role: text("role", { enum: roles }).notNull(),
    timeZone: text("time_zone").notNull().default("UTC"),
    /** Short public handle for avatars and mentions, e.g. initials. */
    initials: text("initials").notNull().default(""),
    disabledAt: instant("disabled_at"),
    /** Bumped by sign-out, password change or reset, role change and disabling: every older session ends. */
    sessionVersion: integer("session_version").notNull().default(0),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("users_email_unique").on(t.email)],
);
export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;

/** Personal API tokens: only a SHA-256 of the token is kept; the token is shown once. */
export const apiTokens = sqliteTable(
  "api_tokens",
  {
    id: idColumn(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    label: text("label").notNull(),
    tokenHash: text("token_hash").notNull(),
    /** First characters of the token, shown in lists so a person can tell tokens apart. */
    prefix: text("prefix").notNull(),
    createdAt: createdAt(),
    lastUsedAt: instant("last_used_at"),
    revokedAt: instant("revoked_at"),
  },
  (t) => [uniqueIndex("api_tokens_hash_unique").on(t.tokenHash), index("api_tokens_user_idx").on(t.userId)],
);
export type ApiToken = typeof apiTokens.$inferSelect;

/** Failed sign-in attempts, shared by every app process through the database. */
export const signInAttempts = sqliteTable(
  "sign_in_attempts",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    /** "account:<email>" or "address:<ip>" */
    bucket: text("bucket").notNull(),
    at: instant("at").notNull(),
  },
  (t) => [index("sign_in_attempts_bucket_at_idx").on(t.bucket, t.at)],
);
