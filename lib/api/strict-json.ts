import { ApiError, type FieldIssue } from "./errors";

/** With the `u` flag a surrogate pair is one code point, so this matches only a lone (unpaired) surrogate. */
const loneSurrogate = /[\uD800-\uDFFF]/u;

/**
 * JSON.parse with two refusals it does not make itself. Duplicate object keys (RFC 8259 §4: names SHOULD be unique;
 * JSON.parse keeps the last) would let a stored payload disagree with the row read from it. Strings with a lone
 * UTF-16 surrogate (a `\ud800` escape) are not Unicode text (RFC 8259 §8.2) and would be stored as U+FFFD, so two
 * distinct ids would collide. Both are 422s naming the field; malformed JSON is a 400.
 */
export function parseStrictJson(text: string): unknown {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new ApiError(400, `body is not valid JSON: ${(error as Error).message}`);
  }
  const duplicate = firstDuplicateKey(text);
  if (duplicate) refuse({ path: duplicate, message: "appears twice in one object; send each key once" });
  const surrogate = firstLoneSurrogate(value, "");
  if (surrogate !== null) refuse({ path: surrogate || "(body)", message: "contains a lone UTF-16 surrogate; send valid Unicode text" });
  return value;
}

function refuse(issue: FieldIssue): never {
  throw new ApiError(422, `invalid request body: ${issue.path}: ${issue.message}`, { issues: [issue] });
}

const join = (path: string, key: string | number) => (path ? `${path}.${key}` : String(key));

/** The dotted path of the first string (value or key) holding a lone surrogate, or null. */
function firstLoneSurrogate(value: unknown, path: string): string | null {
  if (typeof value === "string") return loneSurrogate.test(value) ? path : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = firstLoneSurrogate(value[i], join(path, i));
      if (found !== null) return found;
    }
    return null;
  }
  if (value && typeof value === "object") {
    for (const [key, inner] of Object.entries(value)) {
      if (loneSurrogate.test(key)) return join(path, key);
      const found = firstLoneSurrogate(inner, join(path, key));
      if (found !== null) return found;
    }
  }
  return null;
}

interface Frame {
  keys: Set<string> | null; // null for an array
  path: string;
  index: number;
  key: string | null;
}

/**
 * Scans text already known to be valid JSON for an object that names one key twice; returns its dotted path.
 * Keys are compared decoded, so `"stage"` and `"\u0073tage"` are the same key.
 */
function firstDuplicateKey(text: string): string | null {
  const stack: Frame[] = [];
  const pathHere = () => {
    const top = stack[stack.length - 1];
    if (!top) return "";
    return join(top.path, top.keys ? (top.key ?? "") : top.index);
  };
  let expectKey = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '"') {
      let end = i + 1;
      while (text[end] !== '"') end += text[end] === "\\" ? 2 : 1;
      const top = stack[stack.length - 1];
      if (expectKey && top?.keys) {
        const key = JSON.parse(text.slice(i, end + 1)) as string;
        if (top.keys.has(key)) return join(top.path, key);
        top.keys.add(key);
        top.key = key;
        expectKey = false;
      }
      i = end;
    } else if (ch === "{") {
      stack.push({ keys: new Set(), path: pathHere(), index: 0, key: null });
      expectKey = true;
    } else if (ch === "[") {
      stack.push({ keys: null, path: pathHere(), index: 0, key: null });
    } else if (ch === "}" || ch === "]") {
      stack.pop();
    } else if (ch === ",") {
      const top = stack[stack.length - 1];
      if (top?.keys) expectKey = true;
      else if (top) top.index += 1;
    }
  }
  return null;
}
