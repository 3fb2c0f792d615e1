import { describe, expect, it } from "vitest";
import { SeededRandom } from "@/lib/physics/random";
import { MultipartReader } from "@/lib/storage/multipart-reader";
import { streamMultipart } from "@/lib/storage/multipart-stream";

async function* chunks(bytes: Uint8Array, size: number) {
  for (let at = 0; at < bytes.length; at += size) yield bytes.slice(at, at + size);
}

/** Every part the reader finds: name, filename and content as bytes. */
async function readAll(bytes: Uint8Array, contentType: string, size: number) {
  const boundary = MultipartReader.boundaryOf(contentType);
  if (!boundary) throw new Error("no boundary");
  const reader = new MultipartReader(chunks(bytes, size)[Symbol.asyncIterator](), boundary);
  const parts: Array<{ name: string; filename?: string; bytes: number[] }> = [];
  for (let part = await reader.nextPart(); part; part = await reader.nextPart()) {
    const out: number[] = [];
    for await (const c of reader.content()) out.push(...c);
    parts.push({ name: part.name, ...(part.filename === undefined ? {} : { filename: part.filename }), bytes: out });
  }
  return parts;
}

describe("MultipartReader against the platform's own multipart parser (undici's Response.formData)", () => {
  it("random fields and files, contents full of CRLF and boundary look-alikes, in chunks of every size", async () => {
    const random = new SeededRandom("multipart-reader-check");
    for (let round = 0; round < 8; round++) {
      const form = new FormData();
      const count = 1 + Math.floor(random.uniform() * 4);
      for (let i = 0; i < count; i++) {
        const length = Math.floor(random.uniform() * 300);
        const bytes = Uint8Array.from({ length }, () => [13, 10, 45, 45, 65, 0, 255][Math.floor(random.uniform() * 7)] ?? 0);
        if (random.uniform() < 0.5) form.append(`field${i}`, `value ${i} with "quotes"\r\nand a line`);
        else form.append(`file${i}`, new Blob([bytes]), `name ${i}.bin`);
      }
      const req = new Request("http://localhost/", { method: "POST", body: form });
      const contentType = req.headers.get("content-type") ?? "";
      const body = new Uint8Array(await req.arrayBuffer());
      const reference: Array<{ name: string; filename?: string; bytes: number[] }> = [];
      for (const [name, value] of (await new Response(body, { headers: { "content-type": contentType } }).formData()).entries()) {
        if (typeof value === "string") reference.push({ name, bytes: [...new TextEncoder().encode(value)] });
        else reference.push({ name, filename: value.name, bytes: [...new Uint8Array(await value.arrayBuffer())] });
      }
      for (const size of [1, 2, 7, 61, 100_000]) expect(await readAll(body, contentType, size)).toEqual(reference);
    }
  });

  it("skips a preamble and an epilogue (RFC 2046 §5.1.1)", async () => {
    const body = new TextEncoder().encode('ignored preamble --xyz not yet\r\n--xyz\r\nContent-Disposition: form-data; name="a"\r\n\r\none\r\n--xyz--\r\nepilogue');
    for (const size of [1, 5, 1000]) expect(await readAll(body, "multipart/form-data; boundary=xyz", size)).toEqual([{ name: "a", bytes: [...new TextEncoder().encode("one")] }]);
  });

  it("a body cut before its closing boundary, or without a name, is a 400", async () => {
    const cut = new TextEncoder().encode('--xyz\r\nContent-Disposition: form-data; name="a"\r\n\r\none and no end');
    await expect(readAll(cut, "multipart/form-data; boundary=xyz", 4)).rejects.toMatchObject({ status: 400 });
    const nameless = new TextEncoder().encode("--xyz\r\nContent-Disposition: form-data\r\n\r\none\r\n--xyz--\r\n");
    await expect(readAll(nameless, "multipart/form-data; boundary=xyz", 4)).rejects.toMatchObject({ status: 400 });
  });

  it("streamMultipart: 415 when not multipart, 413 for a file over the limit, fields after the file are kept", async () => {
    const json = new Request("http://localhost/", { method: "POST", body: "{}", headers: { "content-type": "application/json" } });
    await expect(streamMultipart(json, { fileField: "file", maxFileBytes: 10, onFile: async () => 0 })).rejects.toMatchObject({ status: 415 });
    const form = new FormData();
    form.append("file", new Blob(["0123456789abcdef"]), "f.txt");
    form.append("name", "after");
    const make = () => new Request("http://localhost/", { method: "POST", body: form });
    const consume = async (file: { stream: AsyncIterable<Uint8Array> }) => {
      let n = 0;
      for await (const c of file.stream) n += c.byteLength;
      return n;
    };
    await expect(streamMultipart(make(), { fileField: "file", maxFileBytes: 10, onFile: consume })).rejects.toMatchObject({ status: 413 });
    expect(await streamMultipart(make(), { fileField: "file", maxFileBytes: 16, onFile: consume })).toEqual({ fields: { name: "after" }, result: 16 });
  });
});
