import { ApiError } from "@/lib/api/errors";

/** One part's headers (RFC 7578 §4.2: Content-Disposition form-data with a name, and a filename for files). */
export interface PartHeader {
  name: string;
  filename: string | undefined;
  contentType: string;
}

const CRLF = Buffer.from("\r\n");
const HEADER_END = Buffer.from("\r\n\r\n");
const MAX_HEADER_BYTES = 16 * 1024;

const broken = (why: string) => new ApiError(400, `the multipart body could not be read: ${why}`);

/**
 * A pull parser for multipart/form-data (RFC 2046 §5.1.1, RFC 7578) over a byte stream, holding at most one chunk
 * plus the delimiter's length: `nextPart()` reads a part's headers, `content()` yields its bytes until the next
 * delimiter. Parts must be read in order; the content of a part left unread is skipped by the next `nextPart()`.
 */
export class MultipartReader {
  private buf: Buffer = Buffer.alloc(0);
  private ended = false;
  private finished = false;
  private started = false;
  private inPart = false;
  private readonly dashBoundary: Buffer;
  private readonly delimiter: Buffer;

  constructor(
    private readonly source: AsyncIterator<Uint8Array>,
    boundary: string,
  ) {
    this.dashBoundary = Buffer.from(`--${boundary}`);
    this.delimiter = Buffer.from(`\r\n--${boundary}`);
  }

  /** The boundary parameter of a multipart/form-data content type (quoted or not), or null. */
  static boundaryOf(contentType: string): string | null {
    const match = /;\s*boundary=(?:"([^"]{1,70})"|([^;\s]{1,70}))/i.exec(contentType);
    return match ? (match[1] ?? match[2] ?? null) : null;
  }

  private async fill(): Promise<boolean> {
    if (this.ended) return false;
    const next = await this.source.next();
    if (next.done) {
      this.ended = true;
      return false;
    }
    this.buf = this.buf.length ? Buffer.concat([this.buf, next.value]) : Buffer.from(next.value.buffer, next.value.byteOffset, next.value.byteLength);
    return true;
  }

  /** After a delimiter: "--" closes the body, CRLF starts another part. */
  private async afterDelimiter(): Promise<void> {
    while (this.buf.length < 2) if (!(await this.fill())) throw broken("it ends after a boundary");
    if (this.buf[0] === 0x2d && this.buf[1] === 0x2d) this.finished = true;
    else if (this.buf[0] !== 0x0d || this.buf[1] !== 0x0a) throw broken("a boundary is not followed by a line break");
    this.buf = this.buf.subarray(2);
  }

  /** The next part's headers, or null after the closing delimiter. */
  async nextPart(): Promise<PartHeader | null> {
    if (this.inPart) for await (const chunk of this.content()) void chunk;
    if (!this.started) {
      // The first boundary may follow a preamble (ignored) and has no CRLF before it when it opens the body.
      let discarded = false;
      for (;;) {
        const at = this.buf.indexOf(this.dashBoundary);
        if ((at === 0 && !discarded) || (at >= 2 && this.buf[at - 2] === 0x0d && this.buf[at - 1] === 0x0a)) {
          this.buf = this.buf.subarray(at + this.dashBoundary.length);
          break;
        }
        if (at >= 0) {
          this.buf = this.buf.subarray(at + 1);
          discarded = true;
          continue;
        }
        const keep = this.dashBoundary.length + 2;
        if (this.buf.length > keep) {
          this.buf = this.buf.subarray(this.buf.length - keep);
          discarded = true;
        }
        if (!(await this.fill())) throw broken("no boundary found");
      }
      this.started = true;
      await this.afterDelimiter();
    }
    if (this.finished) return null;
    let end = this.buf.indexOf(HEADER_END);
    while (end === -1) {
      if (this.buf.length > MAX_HEADER_BYTES) throw broken("a part's headers are too long");
      if (!(await this.fill())) throw broken("it ends inside a part's headers");
      end = this.buf.indexOf(HEADER_END);
    }
    const header = parseHeaders(this.buf.subarray(0, end).toString("utf8"));
    this.buf = this.buf.subarray(end + HEADER_END.length);
    this.inPart = true;
    return header;
  }

  /** The current part's bytes, chunk by chunk, up to its closing delimiter. */
  async *content(): AsyncGenerator<Buffer> {
    if (!this.inPart) return;
    const keep = this.delimiter.length - 1;
    for (;;) {
      const at = this.buf.indexOf(this.delimiter);
      if (at !== -1) {
        if (at > 0) yield this.buf.subarray(0, at);
        this.buf = this.buf.subarray(at + this.delimiter.length);
        this.inPart = false;
        await this.afterDelimiter();
        return;
      }
      if (this.buf.length > keep) {
        const safe = this.buf.subarray(0, this.buf.length - keep);
        this.buf = this.buf.subarray(this.buf.length - keep);
        yield safe;
      }
      if (!(await this.fill())) throw broken("it ends inside a part (no closing boundary)");
    }
  }

  /** The current part as text, refused past `maxBytes`. */
  async text(maxBytes: number, name: string): Promise<string> {
    const chunks: Buffer[] = [];
    let total = 0;
    for await (const chunk of this.content()) {
      total += chunk.length;
      if (total > maxBytes) throw new ApiError(422, `the field "${name}" is too long`, { issues: [{ path: name, message: "too long" }] });
      chunks.push(chunk);
    }
    return Buffer.concat(chunks).toString("utf8");
  }
}

function parseHeaders(block: string): PartHeader {
  let disposition = "";
  let contentType = "text/plain";
  for (const line of block.split(CRLF.toString())) {
    const colon = line.indexOf(":");
    if (colon < 1) continue;
    const key = line.slice(0, colon).trim().toLowerCase();
    const value = line.slice(colon + 1).trim();
    if (key === "content-disposition") disposition = value;
    else if (key === "content-type") contentType = value;
  }
  if (!/^form-data\b/i.test(disposition)) throw broken("a part has no Content-Disposition: form-data header");
  const params: Record<string, string> = {};
  for (const m of disposition.matchAll(/;\s*([^=;\s]+)\s*=\s*(?:"((?:[^"\\]|\\.)*)"|([^;]*))/g)) {
    const key = (m[1] ?? "").toLowerCase();
    params[key] = m[2] !== undefined ? m[2].replace(/\\(.)/g, "$1") : (m[3] ?? "").trim();
  }
  if (params.name === undefined) throw broken("a part has no name");
  return { name: params.name, filename: params.filename, contentType };
}
