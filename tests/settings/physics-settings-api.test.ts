import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET, PUT } from "@/app/api/v1/settings/physics/route";
import { getDb } from "@/db";
import { events } from "@/db/schema";
import { getCandidateDetail } from "@/lib/data/candidate-detail";
import { ingestCandidate } from "@/lib/services/ingest-trigger";
import { compactness } from "@/lib/validations/physics-settings";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { callRoute, createCaller, type Caller } from "../boards/helpers/api";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
const callers: Record<string, Caller> = {};
const url = "http://localhost/api/v1/settings/physics";
const defaults = {
  nsMaxMassSolar: 3,
  gapUpperMassSolar: 5,
  nsRadiusKm: 12,
  sampleCount: 20_000,
  chirpModel: "pn-3.5",
  pAstroRatePerYear: 50,
  pAstroSnrThreshold: 8,
};

beforeAll(async () => {
  testDb = await setupTestDatabase();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) callers[role] = await createCaller(role);
});
afterAll(() => testDb.cleanup());

const put = (role: string, body: unknown) => callRoute(PUT, { caller: callers[role], method: "PUT", url, body });
const issuePath = (json: Record<string, unknown>) => (json as { issues?: Array<{ path: string }> }).issues?.[0]?.path;

describe("physics settings: everyone reads, coordinators and admins change them", () => {
  it("reads the defaults before anyone saved, for any role", async () => {
    const res = await callRoute(GET, { caller: callers.observer, url });
    expect(res.status).toBe(200);
    expect(res.json).toEqual(defaults);
  });

  it("refuses shifters and observers with 403 and anonymous callers with 401", async () => {
    for (const role of ["shifter", "observer"]) expect((await put(role, defaults)).status).toBe(403);
    expect((await callRoute(PUT, { method: "PUT", url, body: defaults })).status).toBe(401);
  });

  it.each([
    ["a missing field", { ...defaults, nsRadiusKm: undefined }, "nsRadiusKm"],
    ["an unknown field", { ...defaults, extra: 1 }, ""],
    ["an unknown model", { ...defaults, chirpModel: "pn-2" }, "chirpModel"],
    ["a fractional sample count", { ...defaults, sampleCount: 1500.5 }, "sampleCount"],
    ["a zero p-astro rate", { ...defaults, pAstroRatePerYear: 0 }, "pAstroRatePerYear"],
    ["an NS maximum at the gap's upper edge", { ...defaults, nsMaxMassSolar: 4, gapUpperMassSolar: 4 }, "gapUpperMassSolar"],
    ["an NS maximum above the gap's upper edge", { ...defaults, nsMaxMassSolar: 4.5, gapUpperMassSolar: 4 }, "gapUpperMassSolar"],
    ["a star more compact than Buchdahl allows", { ...defaults, nsMaxMassSolar: 4, gapUpperMassSolar: 6, nsRadiusKm: 8 }, "nsRadiusKm"],
  ])("answers 422 naming the field for %s, and stores nothing", async (_name, body, path) => {
    const res = await put("coordinator", body);
    expect(res.status).toBe(422);
    if (path) expect(issuePath(res.json)).toBe(path);
    expect((await callRoute(GET, { caller: callers.observer, url })).json).toEqual(defaults);
  });

  it("accepts the most compact allowed star just under Buchdahl's 4/9", () => {
    // GM☉/c² = 1.4766 km: 4 M☉ in 13.3 km is 0.444 < 4/9 = 0.4444; in 13.2 km it is 0.447.
    expect(compactness(4, 13.3)).toBeLessThan(4 / 9);
    expect(compactness(4, 13.2)).toBeGreaterThan(4 / 9);
  });

  it("saves a coordinator's change, audits the fields before and after, and new triggers use it", async () => {
    const changed = { ...defaults, chirpModel: "leading-order", nsRadiusKm: 11.5 };
    const res = await put("coordinator", changed);
    expect(res.status).toBe(200);
    expect(res.json).toEqual(changed);
    expect((await callRoute(GET, { caller: callers.shifter, url })).json).toEqual(changed);
    const db = await getDb();
    const audit = await db
      .select()
      .from(events)
      .where(and(eq(events.kind, "settings.changed"), eq(events.actorId, callers.coordinator?.user.id ?? "")));
    expect(audit.map((e) => e.data)).toEqual([
      { key: "physics", changed: ["nsRadiusKm", "chirpModel"], before: { nsRadiusKm: 12, chirpModel: "pn-3.5" }, after: { nsRadiusKm: 11.5, chirpModel: "leading-order" } },
    ]);
    const ingested = await ingestCandidate(candidatePayload({ externalId: "PS-ONE", mass1: 1.5, mass2: 1.3 }), new Date());
    const derived = (await getCandidateDetail(ingested.id))?.derived as { fit: { model: string }; settingsUsed: { nsRadiusKm: number } };
    expect(derived.fit.model).toBe("leading-order");
    expect(derived.settingsUsed.nsRadiusKm).toBe(11.5);
  });

  it("lets an admin change them too", async () => {
    expect((await put("admin", defaults)).status).toBe(200);
    expect((await callRoute(GET, { caller: callers.observer, url })).json).toEqual(defaults);
  });
});
