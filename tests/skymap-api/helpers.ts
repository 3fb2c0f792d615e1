import { mkdtempSync, readdirSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { NextRequest } from "next/server";
import { count, eq } from "drizzle-orm";
import { getDb } from "@/db";
import { candidateRevisions, candidates, skymaps, taskReportFiles, triggers, uploads, type Role, type TriageState } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import type { SessionUser } from "@/lib/auth/roles";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

export interface Caller {
  user: SessionUser;
  token: string;
}

export interface SkymapTestEnv {
  db: TestDatabase;
  uploadDir: string;
  cleanup(): Promise<void>;
}

/** A migrated throw-away database and an empty upload store of its own (UPLOAD_DIR). */
export async function setupSkymapTest(): Promise<SkymapTestEnv> {
  const db = await setupTestDatabase();
  const uploadDir = mkdtempSync(path.join(tmpdir(), "chirpdesk-uploads-"));
  process.env.UPLOAD_DIR = uploadDir;
  return {
    db,
    uploadDir,
    async cleanup() {
      await db.cleanup();
      rmSync(uploadDir, { recursive: true, force: true });
    },
  };
}

export async function createCaller(role: Role): Promise<Caller> {
  const user = await createTestUser(role);
  const { token } = await createApiToken(user.id, "sky-map test");
  return { user, token };
}

let counter = 0;

/** A candidate with one revision row (enough for sky maps, visibility and tasks). */
export async function insertCandidate(options: { triageState?: TriageState; receivedAt?: Date } = {}) {
  counter += 1;
  const db = await getDb();
  const at = options.receivedAt ?? new Date(Date.UTC(2030, 2, 20, 0, 0, counter));
  const externalId = `SKY${String(counter).padStart(4, "0")}`;
  const [row] = await db
    .insert(candidates)
    .values({
      source: "test-pipe",
      externalId,
      currentRevision: 1,
      stage: "first-look",
      triageState: options.triageState ?? "new",
      eventTime: at,
      receivedAt: at,
      updatedAt: at,
      networkSnr: 11,
      falseAlarmRatePerYear: 0.1,
      detectors: ["N1", "S1"],
    })
    .returning();
  if (!row) throw new Error("candidate insert returned nothing");
  // Its one trigger, with the candidate's id, as the triggers migration makes for existing candidates.
  await db.insert(triggers).values({
    id: row.id,
    candidateId: row.id,
    source: row.source,
    externalId,
    currentRevision: 1,
    stage: row.stage,
    eventTime: at,
    receivedAt: at,
    updatedAt: at,
    networkSnr: row.networkSnr,
    falseAlarmRatePerYear: row.falseAlarmRatePerYear,
    detectors: row.detectors,
  });
  await db.update(candidates).set({ preferredTriggerId: row.id }).where(eq(candidates.id, row.id));
  const [revision] = await db
    .insert(candidateRevisions)
    .values({ candidateId: row.id, triggerId: row.id, revision: 1, stage: "first-look", eventTime: at, receivedAt: at, payload: {} })
    .returning();
  return { id: row.id, source: row.source, externalId, revisionId: revision?.id ?? "" };
}

type Route<P> = (req: NextRequest, ctx: { params: Promise<P> }) => Promise<Response>;

export interface CallOptions<P> {
  caller?: Caller;
  method?: string;
  url?: string;
  params?: P;
  headers?: Record<string, string>;
  body?: BodyInit;
  json?: unknown;
}

/** Calls a route handler the way Next does (NextRequest + params promise), without a server. */
export async function call<P extends Record<string, string>>(route: Route<P>, options: CallOptions<P>): Promise<{ status: number; json: Record<string, unknown> & { error?: string }; res: Response }> {
  const headers: Record<string, string> = { ...options.headers };
  if (options.caller) headers.authorization = `Bearer ${options.caller.token}`;
  let body = options.body;
  if (options.json !== undefined) {
    headers["content-type"] = "application/json";
    body = JSON.stringify(options.json);
  }
  const req = new NextRequest(options.url ?? "http://localhost/api/v1/test", {
    method: options.method ?? (body === undefined ? "GET" : "POST"),
    headers,
    body,
  });
  const res = await route(req, { params: Promise.resolve(options.params ?? ({} as P)) });
  const type = res.headers.get("content-type") ?? "";
  const json = type.includes("application/json") ? ((await res.clone().json()) as Record<string, unknown>) : {};
  return { status: res.status, json, res };
}

/** A multipart body as raw bytes plus its content type (so a feed signature can be computed over it). */
export async function multipartBody(files: Array<{ field: string; name: string; bytes: Uint8Array; type?: string }>) {
  const form = new FormData();
  for (const f of files) form.append(f.field, new Blob([new Uint8Array(f.bytes)], { type: f.type ?? "application/octet-stream" }), f.name);
  const req = new Request("http://localhost/", { method: "POST", body: form });
  const contentType = req.headers.get("content-type") ?? "";
  const bytes = new Uint8Array(await req.arrayBuffer());
  return { bytes, contentType };
}

export async function rowCounts() {
  const db = await getDb();
  const [u] = await db.select({ n: count() }).from(uploads);
  const [s] = await db.select({ n: count() }).from(skymaps);
  const [f] = await db.select({ n: count() }).from(taskReportFiles);
  return { uploads: u?.n ?? 0, skymaps: s?.n ?? 0, reportFiles: f?.n ?? 0 };
}

/** Every file under the upload store, temporary files included. */
export function storedFiles(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    let entries: string[] = [];
    try {
      entries = readdirSync(d);
    } catch {
      return;
    }
    for (const name of entries) {
      const p = path.join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else out.push(path.relative(dir, p));
    }
  };
  walk(dir);
  return out.sort();
}
