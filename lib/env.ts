import { z } from "zod";
import { parseTrustedProxies } from "./auth/client-address";
import { detectorCodePattern } from "./feed/detector-code";

/**
 * Chirpdesk's one configuration: every variable the product, its worker and its scripts read, in one zod schema.
 * Product code reads `config()` (or takes a `Config` from its caller); nothing else reads process.env.
 * Secrets are optional here so a test, a build or a script runs with only what it uses (each user says what it
 * needs when it is missing); `servingProblems` is the stricter check `npm start` runs before anything starts.
 */
export const defaultDatabaseUrl = "file:./data/chirpdesk.db";
export const defaultUploadDir = "./data/uploads";

const secret = (name: string) => z.string().min(32, `${name} must be at least 32 characters`);
const positiveInt = z.coerce.number().int().positive();

/** Required by `npm start`; optional for tests, builds and scripts. */
const servingShape = {
  NEXTAUTH_URL: z.string().url(),
  NEXTAUTH_SECRET: secret("NEXTAUTH_SECRET"),
  FEED_SIGNING_SECRET: secret("FEED_SIGNING_SECRET"),
  ACK_LINK_SECRET: secret("ACK_LINK_SECRET"),
  VAPID_PUBLIC_KEY: z.string().min(20),
  VAPID_PRIVATE_KEY: z.string().min(20),
  VAPID_SUBJECT: z.string().regex(/^(mailto:|https:)/, "VAPID_SUBJECT must start with mailto: or https:"),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, "SMTP_URL must be smtp://host:port or smtps://…"),
  MAIL_FROM: z.string().min(3),
};

const commonShape = {
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  /** set by Next.js inside its server; absent under tsx and Vitest */
  NEXT_RUNTIME: z.string().optional(),
  DATABASE_URL: z.string().min(1).default(defaultDatabaseUrl),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  /** how long a write waits in all for another process's lock on the database file before answering 503 */
  DATABASE_BUSY_WAIT_MS: positiveInt.default(10_000),
  /** the public origin for links in pages and e-mails, when it differs from NEXTAUTH_URL */
  APP_URL: z.string().url().optional(),
  UPLOAD_DIR: z.string().min(1).default(defaultUploadDir),
  /** development only: the fake SMTP server's inbox API, read by the mailbox page */
  DEV_MAILBOX_URL: z.string().url().optional(),
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
  /** written by server/peer-address.mjs when it stamps requests with the socket's address */
  CHIRPDESK_PEER_HEADER: z.string().optional(),
  /** feed physics threads: default CPUs − 1 (1 to 4); 0 computes inline */
  PHYSICS_THREADS: z.coerce.number().int().min(0).max(16).optional(),
  /** the detector network's site codes, comma-separated; the fictional N1,S1,E1 network by default */
  FEED_NETWORK_SITES: z
    .string()
    .optional()
    .transform((text, ctx) => {
      const codes = (text ?? "").split(",").map((code) => code.trim()).filter(Boolean);
      const bad = codes.filter((code) => !detectorCodePattern.test(code));
      if (bad.length) ctx.addIssue({ code: "custom", message: `not a site code (1–4 uppercase letters or digits, letter first): ${bad.join(", ")}` });
      return codes.length ? [...new Set(codes)] : undefined;
    }),
  /** how often the board's event stream looks for new events */
  EVENT_STREAM_POLL_MS: positiveInt.default(750),
  WORKER_ID: z.string().optional(),
  WORKER_POLL_MS: positiveInt.optional(),
  WORKER_LEASE_MS: positiveInt.optional(),
  WORKER_BATCH: positiveInt.optional(),
  WORKER_CONCURRENCY: positiveInt.optional(),
  /** `npm start`: the server's port, and whether a paging worker starts beside it */
  PORT: z.coerce.number().int().min(1).max(65_535).default(3000),
  START_WORKER: z.enum(["0", "1"]).optional(),
};

const optionalServing = Object.fromEntries(Object.entries(servingShape).map(([k, v]) => [k, v.optional()])) as {
  [K in keyof typeof servingShape]: z.ZodOptional<(typeof servingShape)[K]>;
};
const configSchema = z.object({ ...commonShape, ...optionalServing });
const servingSchema = z.object({ ...commonShape, ...servingShape });

export type Config = z.infer<typeof configSchema>;
export type ServingConfig = z.infer<typeof servingSchema>;
/** The variables the configuration knows: the documentation and the architecture test list them. */
export const configVariables = Object.keys(configSchema.shape) as (keyof Config)[];

type Source = Record<string, string | undefined>;

/** Only the variables we know, with empty strings treated as unset (an empty `KEY=` line in a file means "not set"). */
function known(source: Source): Record<string, string> {
  const out: Record<string, string> = {};
  for (const key of configVariables) {
    const value = source[key];
    if (value !== undefined && value !== "") out[key] = value;
  }
  return out;
}

function describe(issues: readonly z.core.$ZodIssue[]): string[] {
  return issues.map((i) => `${i.path.join(".")}: ${i.message}`);
}

function failure(lines: string[]): Error {
  return new Error(`Chirpdesk configuration is incomplete:\n${lines.map((l) => `  ${l}`).join("\n")}\nSee README.md, "Configuration".`);
}

/** Parses a set of variables into a configuration; a malformed one throws, naming every variable at fault. */
export function parseConfig(source: Source): Config {
  const parsed = configSchema.safeParse(known(source));
  if (!parsed.success) throw failure(describe(parsed.error.issues));
  return parsed.data;
}

/** What `npm start` refuses: every missing secret and every malformed variable, one line each (empty when fine). */
export function servingProblems(source: Source): string[] {
  const parsed = servingSchema.safeParse(known(source));
  return parsed.success ? [] : describe(parsed.error.issues);
}

/** A serving configuration or an error naming every variable at fault. */
export function parseServingConfig(source: Source): ServingConfig {
  const parsed = servingSchema.safeParse(known(source));
  if (!parsed.success) throw failure(describe(parsed.error.issues));
  return parsed.data;
}

let chosen: Config | null = null;
let cached: { key: string; config: Config } | undefined;

/**
 * The process's configuration. Parsed once from the environment (a process's environment does not change; a test
 * that still edits process.env gets a fresh parse, keyed on the values we read), unless a configuration object
 * was chosen with `useConfig`.
 */
export function config(): Config {
  if (chosen) return chosen;
  const source = known(process.env);
  const key = JSON.stringify(source);
  if (cached?.key !== key) cached = { key, config: parseConfig(source) };
  return cached.config;
}

/** Puts a built configuration in place of the environment's (tests, benchmarks); `null` goes back to the environment. */
export function useConfig(next: Config | null): void {
  chosen = next;
}

/** A setting the caller cannot work without (sign-in needs NEXTAUTH_SECRET): its value, or an error naming it. */
export function requireSetting<K extends keyof Config>(key: K, settings: Config = config()): NonNullable<Config[K]> {
  const value = settings[key];
  if (value === undefined || value === null) throw failure([`${key}: required`]);
  return value as NonNullable<Config[K]>;
}
