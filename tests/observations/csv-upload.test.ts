import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { observations } from "@/db/schema";
import * as csvRoute from "@/app/api/v1/tasks/[id]/observations/csv/route";
import { call, createCaller, insertCandidate, multipartBody, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSite, insertTask, observationCounts } from "./helpers";

const NOW_MS = Date.UTC(2030, 2, 20, 6, 0, 0);
const POST = csvRoute.POST.with({ now: () => NOW_MS });

let env: SkymapTestEnv;
let shifter: Caller;
let outsider: Caller;
let taskId: string;

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  outsider = await createCaller("observer");
  const site = await insertSite([{ shape: "rectangle", widthDeg: 1.5, heightDeg: 1.5 }]);
  taskId = await insertTask((await insertCandidate()).id, { siteId: site.id });
});
afterAll(() => env.cleanup());

const header = "ra_deg,dec_deg,start_utc,exposure_s,filter,limiting_mag";
const good = `${header}\r\n10.5,-20,2030-03-20T04:00:00Z,90,g,20.5\r\n11.5,-20,2030-03-20T04:02:00Z,90,"r",\r\n`;

function sendText(text: string, caller: Caller = shifter, type = "text/csv") {
  return call(POST, { caller, params: { id: taskId }, body: text, headers: { "content-type": type } });
}

describe("POST /api/v1/tasks/{id}/observations/csv", () => {
  it("a text/csv body is stored row by row (source csv), the empty cell leaving the field out", async () => {
    const res = await sendText(good);
    expect(res.status).toBe(201);
    expect(res.json.accepted).toBe(2);
    const db = await getDb();
    const [first, second] = await Promise.all((res.json.ids as string[]).map(async (id) => (await db.select().from(observations).where(eq(observations.id, id)))[0]));
    expect(first).toMatchObject({ raDeg: 10.5, decDeg: -20, exposureS: 90, filter: "g", limitingMagnitude: 20.5, source: "csv" });
    // empty limiting_mag → the instrument's own (21, see helpers)
    expect(second).toMatchObject({ raDeg: 11.5, filter: "r", limitingMagnitude: 21 });
  });

  it("the same file as a browser's multipart form (field \"file\") is stored too", async () => {
    const { bytes, contentType } = await multipartBody([{ field: "file", name: "night.csv", bytes: new TextEncoder().encode(good), type: "text/csv" }]);
    const res = await call(POST, { caller: shifter, params: { id: taskId }, body: bytes, headers: { "content-type": contentType } });
    expect(res.status).toBe(201);
    expect(res.json.accepted).toBe(2);
  });

  const many = (n: number) => [header, ...Array.from({ length: n }, (_, k) => `${(k % 3600) / 10},-20,2030-03-20T04:00:00Z,30,g,`)].join("\n");
  it.each([
    ["an empty file", "", "file", 0],
    ["a header only", `${header}\n`, "file", 0],
    ["an unknown column", "ra_deg,dec_deg,start_utc,exposure_s,filter,airmass\n1,1,2030-03-20T04:00:00Z,30,g,1.2\n", "airmass", 0],
    ["a missing required column", "ra_deg,dec_deg,start_utc,filter\n1,1,2030-03-20T04:00:00Z,g\n", "exposure_s", 0],
    ["a row with too few cells", `${header}\n1,1,2030-03-20T04:00:00Z,30,g,\n2,1,2030-03-20T04:00:00Z,30\n`, "row", 2],
    ["a non-number", `${header}\n1,1,2030-03-20T04:00:00Z,30,g,\n1,1,2030-03-20T04:00:00Z,thirty,g,\n`, "exposureS", 2],
    ["a bad row past the parser (Dec off the sphere)", `${header}\n1,1,2030-03-20T04:00:00Z,30,g,\n1,1,2030-03-20T04:00:00Z,30,g,\n1,95,2030-03-20T04:00:00Z,30,g,\n`, "decDeg", 3],
    ["a start over 1 h ahead", `${header}\n1,1,2030-03-20T08:00:00Z,30,g,\n`, "startTime", 1],
    ["10 001 rows", many(10_001), "file", 0],
  ])("%s → 422 naming it, nothing stored", async (_what, text, field, row) => {
    const before = await observationCounts();
    const res = await sendText(text);
    expect(res.status).toBe(422);
    expect(res.json.field).toBe(field);
    expect(res.json.row).toBe(row);
    expect(res.json.error).toContain(field);
    expect(await observationCounts()).toEqual(before);
  });

  it("10 000 rows (the limit) are accepted in one go", async () => {
    const res = await sendText(many(10_000));
    expect(res.status).toBe(201);
    expect(res.json.accepted).toBe(10_000);
  });

  it("refuses other content types (415), bytes that are not UTF-8 (422) and a multipart form without the file (422)", async () => {
    const before = await observationCounts();
    expect((await sendText(good, shifter, "application/json")).status).toBe(415);
    const latin1 = new Uint8Array([...new TextEncoder().encode(`${header}\n1,1,2030-03-20T04:00:00Z,30,`), 0xe9, 0x0a]);
    const bad = await call(POST, { caller: shifter, params: { id: taskId }, body: latin1, headers: { "content-type": "text/csv" } });
    expect(bad.status).toBe(422);
    const { bytes, contentType } = await multipartBody([{ field: "upload", name: "night.csv", bytes: new TextEncoder().encode(good) }]);
    expect((await call(POST, { caller: shifter, params: { id: taskId }, body: bytes, headers: { "content-type": contentType } })).status).toBe(422);
    expect(await observationCounts()).toEqual(before);
  });

  it("the role rules hold for uploads: an observer of no site is refused (403), nothing stored", async () => {
    const before = await observationCounts();
    const res = await sendText(good, outsider);
    expect(res.status).toBe(403);
    expect(await observationCounts()).toEqual(before);
  });
});
