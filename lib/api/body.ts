import { ApiError } from "./errors";

/**
 * Reads a request body as bytes with a size limit: a declared Content-Length over the limit is refused before
 * reading (413); a body that grows past the limit while streaming is cut off and refused (413).
 */
export async function readBodyBytes(req: Request, limitBytes: number, noun = "body"): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > limitBytes) {
    throw new ApiError(413, `the ${noun} is ${declared} bytes; the limit is ${limitBytes} bytes`, { limitBytes });
  }
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limitBytes) {
      await reader.cancel();
      throw new ApiError(413, `the ${noun} is over the limit of ${limitBytes} bytes`, { limitBytes });
    }
    chunks.push(value);
  }
  return concatBytes(chunks, total);
}

/** Joins chunks read from a stream into one buffer of `total` bytes. */
export function concatBytes(chunks: Uint8Array[], total: number): Uint8Array<ArrayBuffer> {
  const out = new Uint8Array(total);
  let at = 0;
  for (const chunk of chunks) {
    out.set(chunk, at);
    at += chunk.byteLength;
  }
  return out;
}
