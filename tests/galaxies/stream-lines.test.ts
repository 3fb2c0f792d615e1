import { describe, expect, it } from "vitest";
import { streamLines } from "@/lib/storage/lines";

async function* chunks(bytes: Uint8Array, size: number) {
  for (let at = 0; at < bytes.length; at += size) yield bytes.slice(at, at + size);
}

async function collect(text: string | Uint8Array, size: number, maxChars = 100) {
  const bytes = typeof text === "string" ? new TextEncoder().encode(text) : text;
  const out: string[] = [];
  for await (const line of streamLines(chunks(bytes, size), maxChars)) out.push(line);
  return out;
}

describe("streamLines", () => {
  const text = "name,ré\r\nÅngström,2\n\nlast without newline";
  it.each([1, 2, 3, 5, 64])("splits LF and CRLF lines the same in chunks of %i bytes (multi-byte characters cut across chunks)", async (size) => {
    expect(await collect(text, size)).toEqual(["name,ré", "Ångström,2", "", "last without newline"]);
  });

  it("a CR alone at the end of the file is dropped too", async () => {
    expect(await collect("a\r\nb\r", 1)).toEqual(["a", "b"]);
  });

  it("refuses a line over the limit, naming it, even before its newline arrives", async () => {
    await expect(collect(`ok\n${"x".repeat(50)}\n`, 7, 20)).rejects.toMatchObject({ status: 422, details: { line: 2 } });
    await expect(collect(`ok\n${"x".repeat(500)}`, 7, 20)).rejects.toMatchObject({ status: 422, details: { line: 2 } });
  });

  it("refuses bytes that are not UTF-8, naming the line, whatever the chunking", async () => {
    const bad = new Uint8Array([...new TextEncoder().encode("a\nb\nc"), 0xc3, 0x28, 0x0a]);
    for (const size of [1, 4, 100]) await expect(collect(bad, size)).rejects.toMatchObject({ status: 422, details: { line: 3 } });
  });
});
