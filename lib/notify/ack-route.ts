import { NextResponse } from "next/server";
import { errorResponse } from "@/lib/api/handler";
import { acknowledgeWithLink } from "./acknowledge";
import { ackPagePath } from "./links";

type RouteContext = { params: Promise<Record<string, string | string[]>> };

/**
 * `POST /ack/<token>/confirm`: the acknowledge page's button (a form POST, answered with 303 back to the page)
 * and the service worker's "Acknowledge" action (`Accept: application/json`, `?via=push`, answered with JSON).
 * The token is the credential: no session is needed. GET never acknowledges, so mail link scanners cannot.
 */
export function createAckConfirmHandler(options: { now?: () => number } = {}) {
  const now = options.now ?? Date.now;
  return async (req: Request, ctx: RouteContext): Promise<Response> => {
    try {
      const raw = (await ctx.params).token;
      const token = Array.isArray(raw) ? raw.join("/") : (raw ?? "");
      const url = new URL(req.url);
      const via = url.searchParams.get("via") === "push" ? "push" : "email";
      const wantsJson = (req.headers.get("accept") ?? "").includes("application/json");
      const result = await acknowledgeWithLink(token, via, new Date(now()));
      if (wantsJson) {
        return result.ok
          ? NextResponse.json({ status: result.outcome, candidateId: result.candidateId, acknowledgedBy: result.acknowledgedBy, acknowledgedAt: result.acknowledgedAt })
          : NextResponse.json({ error: result.message, reason: result.reason }, { status: result.httpStatus });
      }
      const location = result.ok ? `${ackPagePath(token)}?done=1` : ackPagePath(token);
      return new Response(null, { status: 303, headers: { location } });
    } catch (error) {
      return errorResponse(error);
    }
  };
}
