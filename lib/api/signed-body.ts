import { createHmac, randomUUID, timingSafeEqual } from "node:crypto";
import { open, readFile, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { checkSignatureHeaders } from "@/lib/feed/signature";
import { concatBytes } from "./body";
import { ApiError } from "./errors";

/** Bodies up to this size are kept in memory while the MAC runs; larger ones go to a temporary file until verified. */
const IN_MEMORY_BYTES = 8 * 1024 * 1024;

/**
 * Reads a feed-signed body: the signature headers and the declared length are checked before a byte is read (401,
 * 413), then every chunk goes through the HMAC as it arrives. A large body is spooled to a temporary file rather
 * than held in memory, so a post that fails its signature costs disk for a moment, never the server's memory; the
 * file is removed whatever happens. Only a verified body is handed back.
 */
export async function readSignedBody(req: Request, secret: string, nowMs: number, limitBytes: number): Promise<Uint8Array<ArrayBuffer>> {
  const headers = checkSignatureHeaders(req.headers, nowMs);
  if (!headers.ok) throw new ApiError(401, `feed signature refused: ${headers.reason}`);
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > limitBytes) {
    throw new ApiError(413, `the body is ${declared} bytes; the limit is ${limitBytes} bytes`, { limitBytes });
  }
  const mac = createHmac("sha256", secret).update(`${headers.timestamp}.`);
  const spool = limitBytes > IN_MEMORY_BYTES ? join(tmpdir(), `chirpdesk-feed-${randomUUID()}`) : null;
  const file = spool ? await open(spool, "wx", 0o600) : null;
  const chunks: Uint8Array[] = [];
  let total = 0;
  try {
    if (req.body) {
      const reader = req.body.getReader();
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        total += value.byteLength;
        if (total > limitBytes) {
          await reader.cancel();
          throw new ApiError(413, `the body is over the limit of ${limitBytes} bytes`, { limitBytes });
        }
        mac.update(value);
        if (file) await file.write(value);
        else chunks.push(value);
      }
    }
    if (!timingSafeEqual(mac.digest(), headers.digest)) throw new ApiError(401, "feed signature refused: signature does not match");
    if (file && spool) {
      await file.close();
      return new Uint8Array(await readFile(spool));
    }
    return concatBytes(chunks, total);
  } finally {
    await file?.close().catch(() => undefined);
    if (spool) await rm(spool, { force: true });
  }
}
