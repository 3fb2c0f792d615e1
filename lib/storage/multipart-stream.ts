import { ApiError } from "@/lib/api/errors";
import { requireMultipart } from "./multipart";
import { MultipartReader } from "./multipart-reader";

export interface StreamedFile {
  field: string;
  filename: string;
  /** the part's bytes as they arrive; throws a 413 ApiError when the file passes the limit */
  stream: AsyncIterable<Uint8Array>;
}

export interface StreamMultipartOptions<T> {
  /** the one file field; any other file, or a second one, is refused (422) */
  fileField: string;
  maxFileBytes: number;
  /** consumes the file while the request streams in; fields after the file are read once this resolves */
  onFile: (file: StreamedFile) => Promise<T>;
}

const MAX_FIELDS = 20;
const MAX_FIELD_BYTES = 10_000;

const noFile = (field: string) =>
  new ApiError(422, `send exactly one file in the multipart field "${field}"`, { issues: [{ path: field, message: "one file required" }] });

/**
 * Reads a multipart/form-data request as a stream (lib/storage/multipart-reader.ts), never holding the file in
 * memory: text fields are collected, the one file is handed to `onFile` as it arrives. Not multipart → 415; a
 * broken body → 400; a file over the limit → 413. On a refusal the rest of the body is read and dropped (up to the
 * file limit) so the client, still sending, gets the answer rather than a cut connection.
 */
export async function streamMultipart<T>(req: Request, options: StreamMultipartOptions<T>): Promise<{ fields: Record<string, string>; result: T }> {
  const contentType = requireMultipart(req.headers.get("content-type"));
  const boundary = MultipartReader.boundaryOf(contentType);
  if (!boundary) throw new ApiError(400, "the multipart content type has no usable boundary");
  if (!req.body) throw noFile(options.fileField);
  const source = iterate(req.body);
  const reader = new MultipartReader(source, boundary);
  const fields: Record<string, string> = {};
  let done: { result: T } | null = null;
  try {
    let count = 0;
    for (let part = await reader.nextPart(); part; part = await reader.nextPart()) {
      if ((count += 1) > MAX_FIELDS + 1) throw new ApiError(422, "too many parts in the multipart body");
      if (part.filename === undefined) {
        fields[part.name] = await reader.text(MAX_FIELD_BYTES, part.name);
        continue;
      }
      if (part.name !== options.fileField || done) throw noFile(options.fileField);
      done = { result: await options.onFile({ field: part.name, filename: part.filename || "upload", stream: limited(reader.content(), options.maxFileBytes) }) };
    }
    if (!done) throw noFile(options.fileField);
    return { fields, result: done.result };
  } catch (error) {
    if (error instanceof ApiError && error.status === 413) void source.return?.();
    else void drain(source, options.maxFileBytes);
    throw error;
  }
}

async function* limited(chunks: AsyncIterable<Uint8Array>, maxBytes: number): AsyncGenerator<Uint8Array> {
  let total = 0;
  for await (const chunk of chunks) {
    total += chunk.byteLength;
    if (total > maxBytes) throw new ApiError(413, `the file is over the limit of ${maxBytes} bytes`, { limitBytes: maxBytes });
    yield chunk;
  }
}

async function drain(source: AsyncIterator<Uint8Array, undefined>, maxBytes: number): Promise<void> {
  let total = 0;
  try {
    for (let next = await source.next(); !next.done; next = await source.next()) {
      total += next.value.byteLength;
      if (total > maxBytes) break;
    }
  } catch {
    // the client went away: nothing left to answer
  } finally {
    void source.return?.();
  }
}

/** A web stream as an async iterator whose `return()` cancels it (the DOM types have no async iteration). */
function iterate(body: ReadableStream<Uint8Array>): AsyncIterator<Uint8Array, undefined> {
  const streamReader = body.getReader();
  return {
    next: async () => {
      const { done, value } = await streamReader.read();
      return done ? { done: true, value: undefined } : { done: false, value };
    },
    return: async () => {
      await streamReader.cancel().catch(() => undefined);
      return { done: true, value: undefined };
    },
  };
}
