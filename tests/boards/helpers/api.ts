import { NextRequest } from "next/server";
import { getDb } from "@/db";
import { candidates, type Role, type TriageState } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import type { SessionUser } from "@/lib/auth/roles";
import { createTestUser } from "../../helpers/test-db";

type RouteHandler = (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export interface Caller {
  user: SessionUser;
  token: string;
}

export async function createCaller(role: Role, name?: string): Promise<Caller> {
  const user = await createTestUser(role, name ? { name } : {});
  const { token } = await createApiToken(user.id, "boards test");
  return { user, token };
}

/** Calls an exported route handler the way Next does, with a bearer token, without a server. */
export async function callRoute(
  route: RouteHandler,
  options: { caller?: Caller; method?: string; url?: string; body?: unknown; params?: Record<string, string>; headers?: Record<string, string>; signal?: AbortSignal },
): Promise<{ status: number; json: Record<string, unknown> & { error?: string } }> {
  const res = await rawCall(route, options);
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : {} };
}

export function rawCall(
  route: RouteHandler,
  options: { caller?: Caller; method?: string; url?: string; body?: unknown; params?: Record<string, string>; headers?: Record<string, string>; signal?: AbortSignal },
): Promise<Response> {
  const headers: Record<string, string> = { ...options.headers };
  if (options.caller) headers.authorization = `Bearer ${options.caller.token}`;
  if (options.body !== undefined) headers["content-type"] = "application/json";
  const req = new NextRequest(options.url ?? "http://localhost/api/v1/x", {
    method: options.method ?? (options.body === undefined ? "GET" : "POST"),
    headers,
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
    signal: options.signal,
  });
  return route(req, { params: Promise.resolve(options.params ?? {}) });
}

let counter = 0;

/** A bare candidate row in a given triage state (no revision): enough for transition and assignment tests. */
export async function insertCandidate(
  overrides: { triageState?: TriageState; stage?: (typeof candidates.$inferInsert)["stage"]; receivedAt?: Date } = {},
): Promise<string> {
  counter += 1;
  const db = await getDb();
  const at = overrides.receivedAt ?? new Date(Date.UTC(2030, 0, 1, 0, 0, counter));
  const [row] = await db
    .insert(candidates)
    .values({
      source: "test-pipe",
      externalId: `trg-board-${String(counter).padStart(5, "0")}`,
      currentRevision: 1,
      stage: overrides.stage ?? "first-look",
      triageState: overrides.triageState ?? "new",
      eventTime: at,
      receivedAt: at,
      updatedAt: at,
      networkSnr: 10,
      falseAlarmRatePerYear: 0.1,
      detectors: ["N1", "S1"],
    })
    .returning({ id: candidates.id });
  if (!row) throw new Error("insert failed");
  return row.id;
}
