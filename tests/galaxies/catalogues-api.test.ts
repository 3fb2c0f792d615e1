import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { getDb } from "@/db";
import { catalogues, events, galaxies, galaxyCells } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";
import { unpack } from "@/lib/galaxies/pack";
import { importCatalogue } from "@/lib/services/import-catalogue";
import * as listRoute from "@/app/api/v1/catalogues/route";
import * as oneRoute from "@/app/api/v1/catalogues/[id]/route";
import { call, createCaller, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";

let env: SkymapTestEnv;
const callers = {} as Record<"shifter" | "observer" | "coordinator" | "admin", Caller>;

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) callers[role] = await createCaller(role);
});
afterAll(() => env.cleanup());
beforeEach(async () => {
  const db = await getDb();
  await db.delete(catalogues).where(eq(catalogues.state, "ready"));
});

type Part = { field: string; text: string | Uint8Array; filename?: string };

/** A multipart body as a browser would send it, in the order given (so a field may follow the file). */
async function multipart(parts: Part[]) {
  const form = new FormData();
  for (const p of parts) {
    if (p.filename === undefined && typeof p.text === "string") form.append(p.field, p.text);
    else form.append(p.field, new Blob([typeof p.text === "string" ? p.text : new Uint8Array(p.text)], { type: "text/csv" }), p.filename ?? "galaxies.csv");
  }
  const req = new Request("http://localhost/", { method: "POST", body: form });
  return { body: new Uint8Array(await req.arrayBuffer()), contentType: req.headers.get("content-type") ?? "" };
}

async function upload(csv: string | Uint8Array, options: { name?: string; caller?: Caller; nameAfterFile?: boolean } = {}) {
  const file: Part = { field: "file", text: csv, filename: "demo-galaxies.csv" };
  const name: Part[] = options.name === undefined ? [] : [{ field: "name", text: options.name }];
  const { body, contentType } = await multipart(options.nameAfterFile ? [file, ...name] : [...name, file]);
  return call(listRoute.POST, { caller: options.caller ?? callers.coordinator, body, headers: { "content-type": contentType } });
}

async function stored() {
  const db = await getDb();
  const [c] = await db.select({ n: count() }).from(catalogues);
  const [g] = await db.select({ n: count() }).from(galaxies);
  const [p] = await db.select({ n: count() }).from(galaxyCells);
  return { catalogues: c?.n ?? 0, galaxies: g?.n ?? 0, packs: p?.n ?? 0 };
}

const good = ["name,raDeg,decDeg,distanceMpc,weight", "Fict A,10.5,-20.25,120,2.5", '"Fict, B ""dwarf""",0.25,0.1,45.5,', "Fict C,359.9,89.5,300,0.75", ""].join("\r\n");

describe("POST /api/v1/catalogues", () => {
  it("a coordinator uploads a CSV: 201 { id, name, rows }, galaxies stored with their cell, the first becomes the default", async () => {
    const res = await upload(good, { name: "Demo catalogue" });
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ name: "Demo catalogue", rows: 3 });
    const db = await getDb();
    const rows = await db.select().from(galaxies).where(eq(galaxies.catalogueId, String(res.json.id))).orderBy(galaxies.id);
    expect(rows.map((r) => r.name)).toEqual(["Fict A", 'Fict, B "dwarf"', "Fict C"]);
    expect(rows.map((r) => r.weight)).toEqual([2.5, 1, 0.75]);
    // NESTED nside 64: the cell's top 12 bits are the base pixel (Górski et al. 2005, fig. 3): (0.25°, 0.1°) lies in
    // equatorial base pixel 4 (ra −45°…45°), (359.9°, 89.5°) in north polar base pixel 3 (ra 270°…360°).
    expect(Math.floor((rows[1]?.cell ?? 0) / 4096)).toBe(4);
    expect(Math.floor((rows[2]?.cell ?? 0) / 4096)).toBe(3);
    // the ranking packs hold each galaxy once, under its own cell
    const packs = await db.select().from(galaxyCells).where(eq(galaxyCells.catalogueId, String(res.json.id)));
    const packed = unpack(packs.map((p) => ({ count: p.count, data: new Uint8Array(p.data) })));
    expect([...packed.id].sort((a, b) => a - b)).toEqual(rows.map((r) => r.id));
    for (const p of packs) expect(rows.filter((r) => r.cell === p.cell)).toHaveLength(p.count);
    const listed = await call(listRoute.GET, { caller: callers.observer });
    expect(listed.json.catalogues).toEqual([expect.objectContaining({ id: res.json.id, state: "ready", isDefault: true, rows: 3 })]);
  });

  it("takes a name field sent after the file, and without one the file name; a header without weight means weight 1", async () => {
    const after = await upload(good, { name: "Named late", nameAfterFile: true });
    expect(after.status).toBe(201);
    expect(after.json.name).toBe("Named late");
    const unnamed = await upload("decDeg,raDeg,name,distanceMpc\n5,6,Fict D,70\n");
    expect(unnamed.status).toBe(201);
    expect(unnamed.json.name).toBe("demo-galaxies");
    const db = await getDb();
    const [row] = await db.select().from(galaxies).where(eq(galaxies.catalogueId, String(unnamed.json.id)));
    expect(row).toMatchObject({ raDeg: 6, decDeg: 5, weight: 1 });
    const list = (await call(listRoute.GET, { caller: callers.shifter })).json.catalogues as Array<{ isDefault: boolean }>;
    expect(list.filter((c) => c.isDefault)).toHaveLength(1);
  });

  it("a body that arrives in 16-byte chunks is parsed as it streams and imports the same", async () => {
    const { body, contentType } = await multipart([{ field: "name", text: "Chunked" }, { field: "file", text: good, filename: "g.csv" }]);
    const stream = new ReadableStream<Uint8Array>({
      start(controller) {
        for (let at = 0; at < body.length; at += 16) controller.enqueue(body.slice(at, at + 16));
        controller.close();
      },
    });
    const req = new NextRequest("http://localhost/api/v1/catalogues", { method: "POST", body: stream, headers: { "content-type": contentType, authorization: `Bearer ${callers.coordinator.token}` }, duplex: "half" } as ConstructorParameters<typeof NextRequest>[1]);
    const res = await listRoute.POST(req);
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ name: "Chunked", rows: 3 });
  });

  it("a bad row after a written batch → 422 naming row and column, and nothing is kept", async () => {
    const lines = ["name,raDeg,decDeg,distanceMpc,weight"];
    for (let i = 1; i <= 4500; i++) lines.push(`Fict ${i},${(i * 0.07) % 360},${(i % 170) - 85},${50 + i},1`);
    lines[4321] = "Fict bad,12,95,80,1";
    const res = await upload(lines.join("\n"));
    expect(res.status).toBe(422);
    expect(res.json).toMatchObject({ row: 4321, column: "decDeg" });
    expect(res.json.error).toContain("row 4321 (line 4322), column decDeg");
    expect(await stored()).toEqual({ catalogues: 0, galaxies: 0, packs: 0 });
  });

  const refusals: Array<[string, number, string, { row?: number; column?: string }]> = [
    ["a non-number", 422, "name,raDeg,decDeg,distanceMpc\nA,1,2,3\nB,0x10,2,3\n", { row: 2, column: "raDeg" }],
    ["Infinity", 422, "name,raDeg,decDeg,distanceMpc\nA,1,2,Infinity\n", { row: 1, column: "distanceMpc" }],
    ["ra of 360", 422, "name,raDeg,decDeg,distanceMpc\nA,360,2,3\n", { row: 1, column: "raDeg" }],
    ["a distance of 0", 422, "name,raDeg,decDeg,distanceMpc\nA,1,2,0\n", { row: 1, column: "distanceMpc" }],
    ["a negative weight", 422, "name,raDeg,decDeg,distanceMpc,weight\nA,1,2,3,-1\n", { row: 1, column: "weight" }],
    ["an empty name", 422, "name,raDeg,decDeg,distanceMpc\n  ,1,2,3\n", { row: 1, column: "name" }],
    ["an empty required cell", 422, "name,raDeg,decDeg,distanceMpc\nA,1,,3\n", { row: 1, column: "decDeg" }],
    ["a short row", 422, "name,raDeg,decDeg,distanceMpc\nA,1,2,3\nB,1,2\n", { row: 2, column: "row" }],
    ["a missing column", 422, "name,raDeg,distanceMpc\nA,1,3\n", { row: 0, column: "decDeg" }],
    ["an unknown column", 422, "name,raDeg,decDeg,distanceMpc,redshift\nA,1,2,3,0.1\n", { row: 0, column: "redshift" }],
    ["a column twice", 422, "name,raDeg,decDeg,distanceMpc,raDeg\nA,1,2,3,1\n", { row: 0, column: "raDeg" }],
    ["an empty file", 422, "", { row: 0, column: "file" }],
    ["a header only", 422, "name,raDeg,decDeg,distanceMpc\n", { row: 1, column: "file" }],
  ];
  it.each(refusals)("%s → %i naming the place, nothing kept", async (_label, status, csv, where) => {
    const res = await upload(csv);
    expect(res.status).toBe(status);
    expect(res.json).toMatchObject(where);
    expect(await stored()).toEqual({ catalogues: 0, galaxies: 0, packs: 0 });
  });

  it("bytes that are not UTF-8 → 422 naming the line", async () => {
    const bytes = new Uint8Array([...new TextEncoder().encode("name,raDeg,decDeg,distanceMpc\nA,1,2,3\n"), 0xff, 0x41, 0x0a]);
    const res = await upload(bytes);
    expect(res.status).toBe(422);
    expect(res.json).toMatchObject({ line: 3 });
    expect(await stored()).toEqual({ catalogues: 0, galaxies: 0, packs: 0 });
  });

  it("not multipart → 415; no file, two files or a bad name → 422; nothing kept", async () => {
    const json = await call(listRoute.POST, { caller: callers.coordinator, json: { file: good } });
    expect(json.status).toBe(415);
    const noFile = await multipart([{ field: "name", text: "x" }]);
    expect((await call(listRoute.POST, { caller: callers.coordinator, body: noFile.body, headers: { "content-type": noFile.contentType } })).status).toBe(422);
    const two = await multipart([{ field: "file", text: good, filename: "a.csv" }, { field: "file", text: good, filename: "b.csv" }]);
    const twoRes = await call(listRoute.POST, { caller: callers.coordinator, body: two.body, headers: { "content-type": two.contentType } });
    expect(twoRes.status).toBe(422);
    expect(twoRes.json.error).toContain('"file"');
    const badName = await upload(good, { name: "x".repeat(101) });
    expect(badName.status).toBe(422);
    expect(badName.json.issues).toEqual([expect.objectContaining({ path: "name" })]);
    expect(await stored()).toEqual({ catalogues: 0, galaxies: 0, packs: 0 });
  });

  it("a file over the byte limit or the row limit → 413; a bad row after packs were written → 422; nothing kept", async () => {
    const many = ["name,raDeg,decDeg,distanceMpc", ...Array.from({ length: 30 }, (_, i) => `G${i},1,2,3`)].join("\n");
    const request = async () => {
      const { body, contentType } = await multipart([{ field: "file", text: many, filename: "g.csv" }]);
      return new NextRequest("http://localhost/api/v1/catalogues", { method: "POST", body, headers: { "content-type": contentType } });
    };
    await expect(importCatalogue(callers.coordinator.user, await request(), { now: new Date(0), maxFileBytes: 100 })).rejects.toMatchObject({ status: 413 });
    await expect(importCatalogue(callers.coordinator.user, await request(), { now: new Date(0), maxRows: 20 })).rejects.toMatchObject({ status: 413, details: { row: 21 } });
    // after galaxies and ranking packs were written (packs every 10 rows, batches of 2000 rows: a bad row 25)
    const lines = ["name,raDeg,decDeg,distanceMpc", ...Array.from({ length: 2400 }, (_, i) => `G${i},${i % 360},2,3`)];
    lines[2300] = "bad,1,2,-3";
    const { body, contentType } = await multipart([{ field: "file", text: lines.join("\n"), filename: "g.csv" }]);
    const late = new NextRequest("http://localhost/api/v1/catalogues", { method: "POST", body, headers: { "content-type": contentType } });
    await expect(importCatalogue(callers.coordinator.user, late, { now: new Date(0), packFlushRows: 10 })).rejects.toMatchObject({ status: 422, details: { row: 2300, column: "distanceMpc" } });
    expect(await stored()).toEqual({ catalogues: 0, galaxies: 0, packs: 0 });
  });
});

describe("roles", () => {
  it.each(["shifter", "observer", "admin"] as const)("%s reads but may not upload, edit or delete (403)", async (role) => {
    const made = await upload(good);
    const id = String(made.json.id);
    expect((await upload(good, { caller: callers[role] })).status).toBe(403);
    expect((await call(listRoute.GET, { caller: callers[role] })).status).toBe(200);
    expect((await call(oneRoute.GET, { caller: callers[role], params: { id } })).status).toBe(200);
    expect((await call(oneRoute.PATCH, { caller: callers[role], method: "PATCH", params: { id }, json: { name: "x" } })).status).toBe(403);
    expect((await call(oneRoute.DELETE, { caller: callers[role], method: "DELETE", params: { id } })).status).toBe(403);
    expect((await stored()).catalogues).toBe(1);
  });

  it("without credentials every route answers 401", async () => {
    expect((await call(listRoute.GET, {})).status).toBe(401);
    expect((await call(listRoute.POST, { json: {} })).status).toBe(401);
    expect((await call(oneRoute.DELETE, { method: "DELETE", params: { id: "x" } })).status).toBe(401);
  });
});

describe("default, rename and delete", () => {
  it("PATCH moves the default and renames; DELETE removes the galaxies and hands the default to the newest left", async () => {
    const first = String((await upload(good, { name: "First" })).json.id);
    const second = String((await upload(good, { name: "Second" })).json.id);
    const third = String((await upload(good, { name: "Third" })).json.id);
    const coordinator = callers.coordinator;
    const patched = await call(oneRoute.PATCH, { caller: coordinator, method: "PATCH", params: { id: third }, json: { isDefault: true, name: "Third, renamed" } });
    expect(patched.status).toBe(200);
    expect(patched.json.catalogue).toMatchObject({ id: third, isDefault: true, name: "Third, renamed" });
    const list = (await call(listRoute.GET, { caller: coordinator })).json.catalogues as Array<{ id: string; isDefault: boolean }>;
    expect(list.filter((c) => c.isDefault).map((c) => c.id)).toEqual([third]);

    const removed = await call(oneRoute.DELETE, { caller: coordinator, method: "DELETE", params: { id: third } });
    expect(removed.json).toEqual({ deleted: true, newDefaultId: second });
    const db = await getDb();
    expect((await db.select({ n: count() }).from(galaxies).where(eq(galaxies.catalogueId, third)))[0]?.n).toBe(0);
    expect(await stored()).toMatchObject({ galaxies: 6 });
    expect((await call(oneRoute.GET, { caller: coordinator, params: { id: third } })).status).toBe(404);
    expect((await call(oneRoute.GET, { caller: coordinator, params: { id: first } })).json.catalogue).toMatchObject({ isDefault: false });

    const audit = (await db.select().from(events)).filter((e) => e.kind === eventKinds.catalogueChanged && (e.data as { catalogueId?: string }).catalogueId === third);
    expect(audit.map((e) => (e.data as { action: string }).action)).toEqual(["imported", "renamed", "made-default", "deleted"]);
  });

  it("PATCH without a change → 422; an unknown catalogue → 404", async () => {
    const id = String((await upload(good)).json.id);
    expect((await call(oneRoute.PATCH, { caller: callers.coordinator, method: "PATCH", params: { id }, json: {} })).status).toBe(422);
    expect((await call(oneRoute.PATCH, { caller: callers.coordinator, method: "PATCH", params: { id }, json: { isDefault: false } })).status).toBe(422);
    expect((await call(oneRoute.PATCH, { caller: callers.coordinator, method: "PATCH", params: { id: "nope" }, json: { name: "x" } })).status).toBe(404);
    expect((await call(oneRoute.DELETE, { caller: callers.coordinator, method: "DELETE", params: { id: "nope" } })).status).toBe(404);
  });
});
