import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as boardRoute } from "@/app/api/v1/board/route";
import { GET as listRoute } from "@/app/api/v1/candidates/route";
import { GET as notesGet, POST as notesPost } from "@/app/api/v1/candidates/[id]/notes/route";
import { GET as rosterRoute } from "@/app/api/v1/roster/route";
import { getDb } from "@/db";
import { shifts } from "@/db/schema";
import { ingestCandidate } from "@/lib/services/ingest-trigger";
import { transitionCandidate } from "@/lib/services/move-card";
import type { BoardData, CandidateListPage, NoteView } from "@/lib/data/candidates";
import type { Roster } from "@/lib/data/triage";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { callRoute, createCaller, type Caller } from "./helpers/api";
import { candidatePayload } from "@/tests/support/candidate-payload";

let testDb: TestDatabase;
let shifter: Caller;
let observer: Caller;
const ids: Record<string, string> = {};
const base = Date.now() - 3600_000;

beforeAll(async () => {
  testDb = await setupTestDatabase();
  shifter = await createCaller("shifter", "Nia Shifter");
  observer = await createCaller("observer");
  // Three fictional candidates: a neutron-star pair, a heavy pair, and a noisy one; received a minute apart.
  const plans = [
    { externalId: "TB-ALPHA", mass1: 1.5, mass2: 1.3, falseAlarmRatePerYear: 0.001, networkSnr: 20 },
    { externalId: "TB-BRAVO", mass1: 30, mass2: 25, falseAlarmRatePerYear: 0.5, networkSnr: 11, trackSeconds: 0.5 },
    { externalId: "TB-CHARLIE", mass1: 1.4, mass2: 1.35, falseAlarmRatePerYear: 40, networkSnr: 8 },
  ];
  for (const [i, plan] of plans.entries()) {
    const receivedAt = new Date(base + i * 60_000);
    const result = await ingestCandidate(candidatePayload({ ...plan, eventTime: receivedAt }), receivedAt);
    ids[plan.externalId] = result.id;
  }
  await transitionCandidate({ actor: shifter.user, candidateId: ids["TB-CHARLIE"] ?? "", to: "dismissed", reason: "noise", via: "api" });
});
afterAll(() => testDb.cleanup());

describe("the board read", () => {
  it("returns one light card per candidate with the current revision's numbers and the deadlines", async () => {
    const res = await callRoute(boardRoute, { caller: observer });
    expect(res.status).toBe(200);
    const board = res.json as unknown as BoardData;
    expect(board.cards.map((c) => c.externalId)).toEqual(["TB-CHARLIE", "TB-BRAVO", "TB-ALPHA"]);
    const alpha = board.cards.find((c) => c.externalId === "TB-ALPHA");
    expect(alpha?.triageState).toBe("new");
    // Chirp mass of 1.5 + 1.3 M☉ is 1.2115 M☉ (definition, Peters & Mathews 1963); the fit should land near it.
    expect(alpha?.chirpMassDetectorFrame).toBeCloseTo(1.2115, 1);
    expect(alpha?.chirpMassDetectorFrameSd).toBeGreaterThan(0);
    // p-astro at SNR 20, FAR 10⁻³/yr with the defaults: 50·3·8³/20⁴ / (that + 20·10⁻³) = 0.48 / 0.50 (p-astro.ts)
    expect(alpha?.pAstro).toBeCloseTo(0.48 / 0.5, 3);
    expect(alpha?.chirpModel).toBe("pn-3.5");
    expect(alpha?.chirpMassError).toBeNull();
    const p = alpha?.classes;
    expect(p && p.bns + p.nsbh + p.bbh + p.lowerGap).toBeCloseTo(1, 6);
    expect(p && p.bns).toBeGreaterThan(0.5);
    expect(board.cards.find((c) => c.externalId === "TB-BRAVO")?.classes?.bbh).toBeGreaterThan(0.5);
    expect(board.deadlines).toEqual({ acknowledgeWarnMinutes: 3, acknowledgeAlarmMinutes: 5 });
    expect(JSON.stringify(board).length / board.cards.length).toBeLessThan(1200);
  });
});

describe("the candidate list", () => {
  const list = async (query: string) => {
    const res = await callRoute(listRoute, { caller: observer, url: `http://localhost/api/v1/candidates?${query}` });
    return { status: res.status, page: res.json as unknown as CandidateListPage };
  };

  it("sorts on the server in both directions", async () => {
    expect((await list("sort=falseAlarmRatePerYear&dir=asc")).page.rows.map((r) => r.externalId)).toEqual(["TB-ALPHA", "TB-BRAVO", "TB-CHARLIE"]);
    expect((await list("sort=networkSnr&dir=desc")).page.rows.map((r) => r.externalId)).toEqual(["TB-ALPHA", "TB-BRAVO", "TB-CHARLIE"]);
    expect((await list("sort=receivedAt&dir=asc")).page.rows.map((r) => r.externalId)).toEqual(["TB-ALPHA", "TB-BRAVO", "TB-CHARLIE"]);
  });

  it("filters by state, class and search text, and pages", async () => {
    expect((await list("state=dismissed")).page.rows.map((r) => r.externalId)).toEqual(["TB-CHARLIE"]);
    expect((await list("state=new,dismissed")).page.total).toBe(3);
    expect((await list("class=bbh")).page.rows.map((r) => r.externalId)).toEqual(["TB-BRAVO"]);
    expect((await list("q=bravo")).page.rows.map((r) => r.externalId)).toEqual(["TB-BRAVO"]);
    expect((await list(`q=${ids["TB-ALPHA"]}`)).page.rows.map((r) => r.externalId)).toEqual(["TB-ALPHA"]);
    const p2 = await list("pageSize=5&page=1&sort=externalId&dir=asc");
    expect(p2.page).toMatchObject({ total: 3, page: 1, pageSize: 5 });
    // past the last page: the last page, numbered as such
    const beyond = await list("pageSize=5&page=2");
    expect(beyond.page.rows).toHaveLength(3);
    expect(beyond.page).toMatchObject({ total: 3, page: 1 });
  });

  it("refuses unknown sort keys and filter values with 422", async () => {
    expect((await list("sort=password")).status).toBe(422);
    expect((await list("state=maybe")).status).toBe(422);
  });
});

describe("notes and roster", () => {
  it("keeps a notes thread in order with the authors", async () => {
    const id = ids["TB-ALPHA"] ?? "";
    expect((await callRoute(notesPost, { caller: shifter, params: { id }, body: { body: "  " } })).status).toBe(422);
    await callRoute(notesPost, { caller: shifter, params: { id }, body: { body: "checking data quality at S1" } });
    await callRoute(notesPost, { caller: observer, params: { id }, body: { body: "site ready" } });
    const notes = (await callRoute(notesGet, { caller: observer, params: { id } })).json as unknown as NoteView[];
    expect(notes.map((n) => [n.author.name, n.body])).toEqual([
      ["Nia Shifter", "checking data quality at S1"],
      [observer.user.name, "site ready"],
    ]);
    expect((await callRoute(notesPost, { caller: shifter, params: { id: "missing" }, body: { body: "x" } })).status).toBe(404);
  });

  it("lists who is on call now and who may own a candidate", async () => {
    const db = await getDb();
    const now = Date.now();
    await db.insert(shifts).values([
      { startsAt: new Date(now - 3600_000), endsAt: new Date(now + 3600_000), primaryId: shifter.user.id },
      { startsAt: new Date(now + 7200_000), endsAt: new Date(now + 9000_000), primaryId: shifter.user.id },
    ]);
    const roster = (await callRoute(rosterRoute, { caller: observer })).json as unknown as Roster;
    expect(roster.onCall).toHaveLength(1);
    expect(roster.onCall[0]?.primary.id).toBe(shifter.user.id);
    expect(roster.people[0]?.id).toBe(shifter.user.id);
    expect(roster.people.some((p) => p.role === "observer")).toBe(false);
  });
});
