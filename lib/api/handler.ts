import { randomUUID } from "node:crypto";
import { NextRequest, NextResponse } from "next/server";
import type { z, ZodType } from "zod";
import { loggableError } from "@/db/loggable-error";
import { isDatabaseBusy } from "@/db";
import { hasRole, type SessionUser } from "@/lib/auth/roles";
import { resolveRequestUser } from "@/lib/auth/session";
import { feedSigningSecret } from "@/lib/feed/signature";
import { readBodyBytes } from "./body";
import { ApiError, unauthorized } from "./errors";
import { checkJsonContentType, checkSameOrigin } from "./same-origin";
import { readSignedBody } from "./signed-body";
import type { Guard } from "./guards";
import { DEFAULT_MAX_BODY_BYTES, parseJsonBody, parseParams, parseQuery, type RouteContext } from "./request-input";

export type { Guard } from "./guards";

type Schema = ZodType | undefined;
type Infer<T> = T extends ZodType ? z.infer<T> : undefined;

export type HandlerOptions<G extends Guard, P extends Schema, Q extends Schema, B extends Schema> = G & {
  /** zod schemas for the path parameters, the query string and the JSON body; each failure is a 422 naming the field */
  params?: P;
  query?: Q;
  body?: B;
  maxBodyBytes?: number;
};

/** What the guard established: the person for `{ roles }`, the signed bytes for `{ feedSignature }`. */
type GuardContext<G> = G extends { roles: readonly unknown[] }
  ? { user: SessionUser }
  : G extends { feedSignature: true }
    ? { raw: Uint8Array<ArrayBuffer> }
    : object;

export type HandlerContext<G, P, Q, B> = GuardContext<G> & {
  req: NextRequest;
  params: P;
  query: Q;
  body: B;
  /** the instant the request arrived, from the injected clock (never read the wall clock in a route) */
  now: Date;
  requestId: string;
};

/** What a route needs from outside itself; tests pass their own through `route.with({ … })`. */
export interface RouteDeps {
  now: () => number;
  feedSecret: () => string;
}

const defaultDeps: RouteDeps = { now: Date.now, feedSecret: () => feedSigningSecret() };

export interface Route {
  (req: Request, ctx?: RouteContext): Promise<Response>;
  /** The same route with some dependencies replaced (an injected clock, a feed secret). */
  with(deps: Partial<RouteDeps>): Route;
}

/**
 * Wraps a route handler once: authenticates by the declared guard, parses params, query and body with zod, and
 * turns typed errors into one JSON shape. A handler returns a Response or any JSON-serialisable value (sent as 200).
 */
export function handler<G extends Guard, P extends Schema = undefined, Q extends Schema = undefined, B extends Schema = undefined>(
  options: HandlerOptions<G, P, Q, B>,
  fn: (ctx: HandlerContext<G, Infer<P>, Infer<Q>, Infer<B>>) => Promise<unknown>,
): Route {
  const build = (deps: RouteDeps): Route => {
    const route = async (request: Request, routeContext?: RouteContext): Promise<Response> => {
      const requestId = randomUUID();
      try {
        const req = request instanceof NextRequest ? request : new NextRequest(request);
        const nowMs = deps.now();
        const limit = options.maxBodyBytes ?? DEFAULT_MAX_BODY_BYTES;
        const guarded = await authenticate(options, req, deps, nowMs, limit);
        const params = await parseParams(options.params, routeContext);
        const query = parseQuery(options.query, req);
        let body: unknown;
        if (options.body) {
          const bytes = "raw" in guarded && guarded.raw ? guarded.raw : await readBodyBytes(req, limit);
          if (byCookie(options, req)) checkJsonContentType(req, bytes);
          body = parseJsonBody(options.body, bytes);
        }
        const ctx = { ...guarded, req, params, query, body, now: new Date(nowMs), requestId };
        const result = await fn(ctx as HandlerContext<G, Infer<P>, Infer<Q>, Infer<B>>);
        return result instanceof Response ? result : NextResponse.json(result);
      } catch (error) {
        return errorResponse(error, requestId);
      }
    };
    return Object.assign(route, { with: (more: Partial<RouteDeps>) => build({ ...deps, ...more }) });
  };
  return build(defaultDeps);
}

async function authenticate(guard: Guard, req: NextRequest, deps: RouteDeps, nowMs: number, limit: number) {
  if (guard.roles) {
    if (byCookie(guard, req)) checkSameOrigin(req);
    const user = await resolveRequestUser(req.headers);
    if (!user) throw unauthorized();
    if (!hasRole(user, guard.roles)) {
      throw new ApiError(403, `your role (${user.role}) may not do this; allowed: ${guard.roles.join(", ")}`);
    }
    return { user };
  }
  if (guard.feedSignature) {
    // Headers and declared length first, then the body through the MAC; nothing unsigned is ever parsed.
    return { raw: await readSignedBody(req, deps.feedSecret(), nowMs, limit) };
  }
  return {};
}

/** A person's request that a browser may have attached the session cookie to (no bearer token). */
function byCookie(guard: Guard, req: NextRequest): boolean {
  return Boolean(guard.roles) && !req.headers.has("authorization");
}

/** One error shape for every route: `{ error, requestId, ...details }`. Unexpected errors are logged, never silent. */
export function errorResponse(error: unknown, requestId: string = randomUUID()): Response {
  if (isDatabaseBusy(error)) error = new ApiError(503, "the database is busy; retry shortly", { retryAfterSeconds: 1 });
  if (error instanceof ApiError) {
    const headers: Record<string, string> = {};
    if (typeof error.details?.retryAfterSeconds === "number") headers["Retry-After"] = String(error.details.retryAfterSeconds);
    return NextResponse.json({ error: error.message, requestId, ...error.details }, { status: error.status, headers });
  }
  console.error(`[chirpdesk] request ${requestId} failed`, loggableError(error));
  return NextResponse.json({ error: "internal error; quote this request id", requestId }, { status: 500 });
}
