import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { checkReportFileType } from "@/lib/storage";
import { claimTask } from "@/lib/services/claim-task";
import { createTasks } from "@/lib/services/create-tasks";
import { reportTask } from "@/lib/services/move-task";
import * as reportFilesRoute from "@/app/api/v1/reports/[reportId]/files/route";
import * as reportsRoute from "@/app/api/v1/reports/route";
import * as uploadRoute from "@/app/api/v1/uploads/[id]/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, multipartBody, rowCounts, setupSkymapTest, storedFiles, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
let shifter: Caller;
let observer: Caller;
let otherObserver: Caller;
let coordinator: Caller;
let candidateId: string;
let reportId: string;

// A 1×1 PNG (signature, IHDR, IDAT, IEND), a minimal PDF and JPEG start, a CSV table.
const png = new Uint8Array(Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64"));
const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n");
const jpeg = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0xff, 0xd9]);
const csv = new TextEncoder().encode("mjd,band,mag\n62000.1,r,19.2\n62000.2,g,19.6\n");

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  observer = await createCaller("observer");
  otherObserver = await createCaller("observer");
  coordinator = await createCaller("coordinator");
  candidateId = (await insertCandidate({ triageState: "pursue" })).id;
  const [task] = await createTasks(shifter.user, candidateId, [
    { kind: "galaxy-targeted", siteId: null, windowStart: null, windowEnd: null, priority: 2, notes: "" },
  ]);
  if (!task) throw new Error("no task");
  await claimTask(observer.user, task.id);
  reportId = (await reportTask(observer.user, task.id, "Nothing new brighter than r = 21 in 14 galaxies")).reportId;
});
afterAll(() => env.cleanup());

async function attach(files: Array<{ name: string; bytes: Uint8Array }>, caller: Caller = observer, id = reportId) {
  const { bytes, contentType } = await multipartBody(files.map((f) => ({ field: "files", ...f })));
  return call(reportFilesRoute.POST, { caller, params: { reportId: id }, body: bytes, headers: { "content-type": contentType } });
}

async function expectNothingKept<T>(fn: () => Promise<T>): Promise<T> {
  const before = await rowCounts();
  const files = storedFiles(env.uploadDir);
  const result = await fn();
  expect(await rowCounts()).toEqual(before);
  expect(storedFiles(env.uploadDir)).toEqual(files);
  return result;
}

describe("report files: type checks by content", () => {
  it.each([
    ["frame.png", png, "image/png"],
    ["frame.JPG", jpeg, "image/jpeg"],
    ["summary.pdf", pdf, "application/pdf"],
    ["photometry.csv", csv, "text/csv; charset=utf-8"],
    ["photometry.txt", csv, "text/plain; charset=utf-8"],
    ["stack.fits", fixtureBytes("malformed/good-n16.fits"), "application/fits"],
    ["stack.fits.gz", fixtureBytes("single-nested-n128.fits.gz"), "application/gzip"],
  ])("accepts %s as %s", (name, bytes, mime) => {
    const result = checkReportFileType(name, bytes);
    expect(result.ok && result.type.mimeType).toBe(mime);
  });

  it.each([
    ["photo.png", pdf, /content is PDF but the name ends in \.png/],
    ["notes.pdf", csv, /text files must end in/],
    ["tool.exe", new Uint8Array([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0xff, 0xfe]), /not PNG, JPEG, FITS, PDF or UTF-8 text/],
    ["table.csv", new Uint8Array([0x61, 0x2c, 0x62, 0x0a, 0x00, 0x31]), /not PNG, JPEG, FITS, PDF or UTF-8 text/],
    ["archive.gz", fixtureBytes("single-nested-n128.fits.gz"), /only as compressed FITS/],
    ["frame", png, /name ends in \.\(none\)/],
  ])("refuses %s", (name, bytes, reason) => {
    const result = checkReportFileType(name, bytes);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.reason).toMatch(reason);
  });
});

describe("POST /api/v1/reports/:id/files", () => {
  it("attaches several files at once, with their sniffed types, and lists them under the candidate", async () => {
    const res = await attach([
      { name: "frame.png", bytes: png },
      { name: "summary.pdf", bytes: pdf },
      { name: "photometry.csv", bytes: csv },
    ]);
    expect(res.status).toBe(201);
    const files = res.json.files as Array<{ id: string; mimeType: string; originalName: string; sizeBytes: number }>;
    expect(files.map((f) => [f.originalName, f.mimeType])).toEqual([
      ["frame.png", "image/png"],
      ["summary.pdf", "application/pdf"],
      ["photometry.csv", "text/csv; charset=utf-8"],
    ]);
    const listed = await call(reportsRoute.GET, { caller: shifter, url: `http://localhost/api/v1/reports?candidateId=${candidateId}` });
    const reports = listed.json.reports as Array<{ id: string; result: string; files: Array<{ id: string }>; author: { id: string } }>;
    expect(reports).toHaveLength(1);
    expect(reports[0]?.author.id).toBe(observer.user.id);
    expect(reports[0]?.files.map((f) => f.id).sort()).toEqual(files.map((f) => f.id).sort());
    const own = await call(reportFilesRoute.GET, { caller: shifter, params: { reportId } });
    expect((own.json.files as unknown[]).length).toBe(3);
  });

  it("downloads a file with its stored type, a Content-Disposition and the same bytes", async () => {
    const res = await attach([{ name: "résumé frame.png", bytes: png }, { name: "summary.pdf", bytes: pdf }]);
    const [image, doc] = res.json.files as Array<{ id: string }>;
    const got = await call(uploadRoute.GET, { caller: shifter, params: { id: image?.id ?? "" }, url: "http://localhost/x" });
    expect(got.status).toBe(200);
    expect(got.res.headers.get("content-type")).toBe("image/png");
    expect(got.res.headers.get("content-disposition")).toMatch(/^inline; filename="r_sum_ frame\.png"; filename\*=UTF-8''r%C3%A9sum%C3%A9%20frame\.png$/);
    expect(Buffer.compare(Buffer.from(await got.res.arrayBuffer()), Buffer.from(png))).toBe(0);
    const docRes = await call(uploadRoute.GET, { caller: observer, params: { id: doc?.id ?? "" }, url: "http://localhost/x" });
    expect(docRes.res.headers.get("content-disposition")).toMatch(/^attachment; filename="summary\.pdf"/);
    expect((await call(uploadRoute.GET, { params: { id: doc?.id ?? "" }, url: "http://localhost/x" })).status).toBe(401);
    expect((await call(uploadRoute.GET, { caller: shifter, params: { id: "nope" }, url: "http://localhost/x" })).status).toBe(404);
  });

  it("refuses a file whose content does not match its name (415) and attaches none of the batch", async () => {
    const res = await expectNothingKept(() => attach([{ name: "ok.png", bytes: png }, { name: "fake.png", bytes: pdf }]));
    expect(res.status).toBe(415);
    expect(res.json.error).toMatch(/fake\.png/);
  });

  it("refuses a file over 50 MB with 413", async () => {
    const big = new Uint8Array(50 * 1024 * 1024 + 1);
    big.set(png.subarray(0, 8));
    const res = await expectNothingKept(() => attach([{ name: "huge.png", bytes: big }]));
    expect(res.status).toBe(413);
    expect(res.json.error).toMatch(/at most 52428800 bytes/);
  });

  it("lets only the report's author or a coordinator attach", async () => {
    expect((await expectNothingKept(() => attach([{ name: "a.png", bytes: png }], otherObserver))).status).toBe(403);
    expect((await expectNothingKept(() => attach([{ name: "a.png", bytes: png }], shifter))).status).toBe(403);
    expect((await attach([{ name: "by-coordinator.csv", bytes: csv }], coordinator)).status).toBe(201);
  });

  it("answers 404 for an unknown report and 422 without files", async () => {
    expect((await attach([{ name: "a.png", bytes: png }], observer, "no-such-report")).status).toBe(404);
    const { bytes, contentType } = await multipartBody([{ field: "other", name: "a.png", bytes: png }]);
    const none = await call(reportFilesRoute.POST, { caller: observer, params: { reportId }, body: bytes, headers: { "content-type": contentType } });
    expect(none.status).toBe(422);
  });
});
