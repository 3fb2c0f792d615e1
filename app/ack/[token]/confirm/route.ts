import { NextResponse } from "next/server";
import { z } from "zod";
import { handler } from "@/lib/api/handler";
import { acknowledgeWithLink } from "@/lib/notify/acknowledge";
import { ackPagePath } from "@/lib/notify/links";
import { ackTokenParams } from "@/lib/validations/params";

/** `?via=push` from the service worker; anything else counts as the e-mail link (as it always has). */
const ackQuery = z.object({ via: z.enum(["email", "push"]).catch("email").default("email") });

/**
 * `POST /ack/<token>/confirm`: the acknowledge page's button (a form POST, answered with 303 back to the page)
 * and the service worker's "Acknowledge" action (`Accept: application/json`, `?via=push`, answered with JSON).
 * The token is the credential: no session is needed. GET never acknowledges, so mail link scanners cannot.
 */
export const POST = handler({ ackToken: true, params: ackTokenParams, query: ackQuery }, async ({ req, params, query, now }) => {
  const { token } = params;
  const result = await acknowledgeWithLink(token, query.via, now);
  if ((req.headers.get("accept") ?? "").includes("application/json")) {
    return result.ok
      ? NextResponse.json({ status: result.outcome, candidateId: result.candidateId, acknowledgedBy: result.acknowledgedBy, acknowledgedAt: result.acknowledgedAt })
      : NextResponse.json({ error: result.message, reason: result.reason }, { status: result.httpStatus });
  }
  const location = result.ok ? `${ackPagePath(token)}?done=1` : ackPagePath(token);
  return new Response(null, { status: 303, headers: { location } });
});
