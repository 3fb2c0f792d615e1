import { NextRequest } from "next/server";
import { count } from "drizzle-orm";
import type { SQLiteTable } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db";
import { candidateRevisions, candidates, deadLetters, derivedQuantities, events, followUpTasks } from "@/db/schema";
import { signFeedBody } from "@/lib/feed/signature";
import { chirpMassFromComponents, pnChirpFrequencyAt } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";

export const testSecret = "feed-test-secret-0123456789-abcdefghijklmnop";

/** The feed route reads only FEED_SIGNING_SECRET; the rest keeps any paging hook that reads the environment happy. */
export function setTestEnvironment(): void {
  process.env.FEED_SIGNING_SECRET = testSecret;
  const defaults: Record<string, string> = {
    NEXTAUTH_URL: "http://localhost:3999",
    NEXTAUTH_SECRET: "test-nextauth-secret-0123456789abcdef",
    ACK_LINK_SECRET: "test-ack-link-secret-0123456789abcdef",
    VAPID_PUBLIC_KEY: "test-vapid-public-key-000000",
    VAPID_PRIVATE_KEY: "test-vapid-private-key-00000",
    VAPID_SUBJECT: "mailto:ops@example.test",
    SMTP_URL: "smtp://127.0.0.1:1",
    MAIL_FROM: "Chirpdesk <chirpdesk@example.test>",
  };
  for (const [key, value] of Object.entries(defaults)) process.env[key] ??= value;
}

let counter = 0;

/**
 * A small valid feed body: a neutron-star pair whose track follows the 3.5PN TaylorT4 chirp of its own
 * component masses (1.5 + 1.3 M☉, detector frame), reaching the ISCO at eventTime. Each sample is its own
 * signal (event times 10 s apart), so samples never group into one candidate unless a test sets eventTime.
 */
export function samplePayload(overrides: Partial<FeedCandidate> = {}): FeedCandidate {
  counter += 1;
  const t = Array.from({ length: 60 }, (_, i) => -30 + i * 0.45);
  return {
    source: "pipeline-test",
    externalId: `trg-feed-${String(counter).padStart(5, "0")}`,
    revision: 1,
    stage: "first-look",
    // A signal of its own: 10 s from the previous sample's, far outside the ±1 s coincidence window.
    eventTime: new Date(Date.parse("2026-12-01T04:12:00.250Z") - counter * 10_000).toISOString(),
    detectors: ["N1", "S1"],
    networkSnr: 12.5,
    falseAlarmRatePerYear: 0.01,
    frequencyTrack: { t, f: t.map((time) => pnChirpFrequencyAt(chirpMassFromComponents(1.5, 1.3), (1.5 * 1.3) / 2.8 ** 2, 0, time)) },
    masses: { m1: { mean: 1.5, sd: 0.1 }, m2: { mean: 1.3, sd: 0.1 } },
    distanceMpc: { mean: 120, sd: 30 },
    ...overrides,
  };
}

export interface SignOptions {
  nowMs?: number;
  secret?: string;
  headers?: Record<string, string>;
  unsigned?: boolean;
}

export function feedRequest(rawBody: string, options: SignOptions = {}): NextRequest {
  const signature = options.unsigned ? {} : signFeedBody(options.secret ?? testSecret, rawBody, options.nowMs ?? Date.now());
  return new NextRequest("http://localhost/api/v1/feed/candidates", {
    method: "POST",
    body: rawBody,
    headers: { "content-type": "application/json", ...signature, ...options.headers },
  });
}

export async function rowCounts() {
  const db = await getDb();
  const n = async (table: SQLiteTable) => {
    const [row] = await db.select({ n: count() }).from(table);
    return row?.n ?? 0;
  };
  return {
    candidates: await n(candidates),
    revisions: await n(candidateRevisions),
    derived: await n(derivedQuantities),
    events: await n(events),
    tasks: await n(followUpTasks),
    deadLetters: await n(deadLetters),
  };
}
