import { ApiError } from "@/lib/api/errors";

/**
 * The lines of a UTF-8 text stream, one at a time (LF or CRLF; a last line without a newline counts), so a file
 * of any size is read in constant memory. Bytes that are not UTF-8, or a line over `maxChars`, are refused with a
 * 422 naming the line (from 1).
 */
export async function* streamLines(stream: AsyncIterable<Uint8Array>, maxChars: number): AsyncGenerator<string> {
  const decoder = new TextDecoder("utf-8", { fatal: true });
  let rest = "";
  let line = 0;
  const decode = (chunk?: Uint8Array) => {
    try {
      return chunk ? decoder.decode(chunk, { stream: true }) : decoder.decode();
    } catch {
      // Which line: the newlines before the first undecodable byte, found by decoding again with replacement.
      const lenient = rest + new TextDecoder("utf-8").decode(chunk ?? new Uint8Array(0));
      const upTo = lenient.slice(0, Math.max(0, lenient.indexOf("\uFFFD")));
      const at = line + 1 + (upTo.match(/\n/g)?.length ?? 0);
      throw new ApiError(422, `line ${at}: the file is not UTF-8 text`, { line: at });
    }
  };
  for await (const chunk of stream) {
    const text = rest + decode(chunk);
    let start = 0;
    for (let nl = text.indexOf("\n"); nl !== -1; nl = text.indexOf("\n", start)) {
      line += 1;
      if (nl - start > maxChars + 1) throw tooLong(line, maxChars);
      yield text.charCodeAt(nl - 1) === 13 && nl > start ? text.slice(start, nl - 1) : text.slice(start, nl);
      start = nl + 1;
    }
    rest = text.slice(start);
    if (rest.length > maxChars + 1) throw tooLong(line + 1, maxChars);
  }
  rest += decode();
  if (rest !== "") yield rest.endsWith("\r") ? rest.slice(0, -1) : rest;
}

const tooLong = (line: number, maxChars: number) => new ApiError(422, `line ${line} is longer than ${maxChars} characters`, { line });
