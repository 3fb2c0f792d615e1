import type { NextRequest } from "next/server";
import type { ZodType } from "zod";
import { readBodyBytes } from "./body";
import { ApiError, invalid } from "./errors";

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

/** Reads at most `limit` bytes of text; a larger body is a 413 without reading the rest. */
export async function readBodyText(req: Request, limit = DEFAULT_MAX_BODY_BYTES): Promise<string> {
  return Buffer.from(await readBodyBytes(req, limit)).toString("utf8");
}

export function parseJsonText(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new ApiError(400, `body is not valid JSON: ${(error as Error).message}`);
  }
}

/** An empty body parses as `{}`, so a schema of optional fields accepts a bare POST. */
export function parseJsonBody(schema: ZodType, text: string): unknown {
  const parsed = schema.safeParse(text === "" ? {} : parseJsonText(text));
  if (!parsed.success) throw invalid(parsed.error);
  return parsed.data;
}
