import { randomUUID } from "node:crypto";
import { NextResponse, type NextRequest } from "next/server";
import type { z, ZodType } from "zod";
import { loggableError } from "@/db/loggable-error";
import { resolveRequestUser } from "@/lib/auth/session";
import { hasRole, type Role, type SessionUser } from "@/lib/auth/roles";
import { readBodyBytes } from "./body";
import { ApiError, invalid, unauthorized } from "./errors";

/** The request body limit unless a route says otherwise. */
const DEFAULT_MAX_BODY_BYTES = 1_000_000;

interface HandlerOptions<B extends ZodType | undefined, Q extends ZodType | undefined> {
  /** Roles allowed to call; every route must say. */
  roles: readonly Role[];
  body?: B;
  query?: Q;
  maxBodyBytes?: number;
}

type Infer<T> = T extends ZodType ? z.infer<T> : undefined;

export interface HandlerContext<B, Q> {
  req: NextRequest;
  user: SessionUser;
  body: B;
  query: Q;
  params: Record<string, string>;
  requestId: string;
}

type RouteContext = { params?: Promise<Record<string, string | string[]> | undefined> };

/**
 * Wraps a route handler once: resolves the session or bearer token, checks the role, parses input with zod,
 * and turns typed errors into JSON. A handler returns a Response or any JSON-serialisable value (sent as 200).
 */
export function handler<B extends ZodType | undefined = undefined, Q extends ZodType | undefined = undefined>(
  options: HandlerOptions<B, Q>,
  fn: (ctx: HandlerContext<Infer<B>, Infer<Q>>) => Promise<unknown>,
) {
  return async (req: NextRequest, routeContext?: RouteContext): Promise<Response> => {
    const requestId = randomUUID();
    try {
      const user = await resolveRequestUser(req.headers);
      if (!user) throw unauthorized();
      if (!hasRole(user, options.roles)) {
        throw new ApiError(403, `your role (${user.role}) may not do this; allowed: ${options.roles.join(", ")}`);
      }
      const params = await readParams(routeContext);
      const query = options.query ? parseQuery(options.query, req) : undefined;
      const body = options.body ? await parseJsonBody(options.body, req, options.maxBodyBytes) : undefined;
      const result = await fn({ req, user, body: body as Infer<B>, query: query as Infer<Q>, params, requestId });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (error) {
      return errorResponse(error, requestId);
    }
  };
}

async function readParams(ctx?: RouteContext): Promise<Record<string, string>> {
  const raw = (ctx?.params ? await ctx.params : undefined) ?? {};
  return Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v.join("/") : v]));
}

function parseQuery(schema: ZodType, req: NextRequest): unknown {
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

async function parseJsonBody(schema: ZodType, req: NextRequest, limit?: number): Promise<unknown> {
  const text = await readBodyText(req, limit);
  const parsed = schema.safeParse(text === "" ? {} : parseJsonText(text));
  if (!parsed.success) throw invalid(parsed.error);
  return parsed.data;
}

/** One error shape for every route: `{ error, requestId, ...details }`. Unexpected errors are logged, never silent. */
export function errorResponse(error: unknown, requestId: string = randomUUID()): Response {
  if (error instanceof ApiError) {
    const headers: Record<string, string> = {};
    if (typeof error.details?.retryAfterSeconds === "number") headers["Retry-After"] = String(error.details.retryAfterSeconds);
    return NextResponse.json({ error: error.message, requestId, ...error.details }, { status: error.status, headers });
  }
  console.error(`[chirpdesk] request ${requestId} failed`, loggableError(error));
  return NextResponse.json({ error: "internal error; quote this request id", requestId }, { status: 500 });
}
