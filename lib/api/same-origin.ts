import type { NextRequest } from "next/server";
import { appBaseUrl } from "@/lib/notify/links";
import { ApiError } from "./errors";

const writeMethods = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** The origins the app answers as: its public URL (APP_URL, else NEXTAUTH_URL) and the host the request came to. */
function ownOrigins(req: NextRequest): Set<string> {
  const origins = new Set<string>([req.nextUrl.origin]);
  try {
    origins.add(new URL(appBaseUrl()).origin);
  } catch {
    // a malformed setting names no origin; the configuration check reports it
  }
  return origins;
}

/**
 * Cross-site request forgery: a browser attaches the session cookie to a form or fetch another page started, so a
 * cookie-authenticated write must come from one of our own pages. Browsers send `Sec-Fetch-Site` (Fetch Metadata)
 * and `Origin` on every non-GET request; "same-site" is refused too, because another port on the same host is
 * same-site but not us. A request carrying neither header did not come from a browser page (it cannot be forged
 * through one), so it passes. Bearer-token calls never reach this check: no browser attaches a bearer token.
 */
export function checkSameOrigin(req: NextRequest): void {
  if (!writeMethods.has(req.method)) return;
  const fetchSite = req.headers.get("sec-fetch-site");
  if (fetchSite && fetchSite !== "same-origin") {
    throw new ApiError(403, `cross-site write refused: Sec-Fetch-Site is ${fetchSite}; writes must come from Chirpdesk's own pages`, {
      reason: "cross-site",
    });
  }
  const origin = req.headers.get("origin");
  if (origin === null) return;
  if (!ownOrigins(req).has(origin)) {
    throw new ApiError(403, `cross-site write refused: Origin ${origin} is not Chirpdesk's own`, { reason: "cross-site" });
  }
}

/** A cookie-authenticated body that is not declared as JSON where JSON is expected (a form or text/plain post). */
export function checkJsonContentType(req: NextRequest, bytes: Uint8Array): void {
  const declared = req.headers.get("content-type");
  if (declared === null && bytes.byteLength === 0) return;
  const type = (declared ?? "").split(";")[0]?.trim().toLowerCase() ?? "";
  if (type === "application/json" || /^application\/[\w.+-]+\+json$/.test(type)) return;
  throw new ApiError(415, `the body must be sent as application/json (got ${declared ?? "no Content-Type"})`, {
    reason: "unsupported-media-type",
  });
}
