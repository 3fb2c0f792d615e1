import { z } from "zod";
import { parseTrustedProxies } from "@/lib/auth/client-address";

const optionalUrl = z.string().url().optional();

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().min(1).default("file:./data/chirpdesk.db"),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  NEXTAUTH_URL: z.string().url(),
  NEXTAUTH_SECRET: z.string().min(32, "NEXTAUTH_SECRET must be at least 32 characters"),
  FEED_SIGNING_SECRET: z.string().min(32, "FEED_SIGNING_SECRET must be at least 32 characters"),
  ACK_LINK_SECRET: z.string().min(32, "ACK_LINK_SECRET must be at least 32 characters"),
  VAPID_PUBLIC_KEY: z.string().min(20),
  VAPID_PRIVATE_KEY: z.string().min(20),
  VAPID_SUBJECT: z.string().regex(/^(mailto:|https:)/, "VAPID_SUBJECT must start with mailto: or https:"),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, "SMTP_URL must be smtp://host:port or smtps://…"),
  MAIL_FROM: z.string().min(3),
  UPLOAD_DIR: z.string().default("./data/uploads"),
  /** development only: the fake SMTP server's inbox API, read by the mailbox page */
  DEV_MAILBOX_URL: optionalUrl,
  SEED_DEMO: z.enum(["0", "1"]).optional(),
  /** proxies whose X-Forwarded-For is believed: comma-separated addresses or CIDR ranges; none by default */
  TRUSTED_PROXIES: z
    .string()
    .optional()
    .superRefine((text, ctx) => {
      try {
        parseTrustedProxies(text);
      } catch (error) {
        ctx.addIssue({ code: "custom", message: (error as Error).message });
      }
    }),
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | undefined;

/** Parses the environment once; a missing or malformed variable fails fast, naming every one at fault. */
export function getEnv(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Chirpdesk configuration is incomplete:\n${lines.join("\n")}\nSee README.md, "Configuration".`);
  }
  cached = parsed.data;
  return cached;
}

/** For tests that change the environment between cases. */
export function resetEnvCache(): void {
  cached = undefined;
}

/** The database location alone, so migrations and scripts need no other secret. */
export function getDatabaseUrl(): string {
  return process.env.DATABASE_URL || "file:./data/chirpdesk.db";
}
