import type { NextRequest } from "next/server";
import type { ZodType } from "zod";
import { ApiError, invalid } from "./errors";
import { parseStrictJson } from "./strict-json";

/** The request body limit unless a route says otherwise. */
export const DEFAULT_MAX_BODY_BYTES = 1_000_000;

export type RouteContext = { params?: Promise<Record<string, string | string[]> | undefined> };

/** Path parameters as Next hands them (already decoded; catch-all segments joined with "/"), then the schema. */
export async function parseParams(schema: ZodType | undefined, ctx?: RouteContext): Promise<unknown> {
  if (!schema) return undefined;
  const raw = (ctx?.params ? await ctx.params : undefined) ?? {};
  const flat = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v.join("/") : v]));
  const parsed = schema.safeParse(flat);
  if (!parsed.success) throw invalid(parsed.error, "path");
  return parsed.data;
}

export function parseQuery(schema: ZodType | undefined, req: NextRequest): unknown {
  if (!schema) return undefined;
  const parsed = schema.safeParse(Object.fromEntries(req.nextUrl.searchParams));
  if (!parsed.success) throw invalid(parsed.error, "query");
  return parsed.data;
}

/** An empty body parses as `{}`, so a schema of optional fields accepts a bare POST. */
export function parseJsonBody(schema: ZodType, bytes: Uint8Array): unknown {
  const text = decodeUtf8(bytes);
  const parsed = schema.safeParse(text === "" ? {} : parseStrictJson(text));
  if (!parsed.success) throw invalid(parsed.error);
  return parsed.data;
}

/** Request bodies are UTF-8 (RFC 8259 §8.1); a byte sequence that is not is refused rather than replaced with U+FFFD. */
export function decodeUtf8(bytes: Uint8Array): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new ApiError(400, "body is not valid UTF-8 text", { reason: "not-utf-8" });
  }
}
