import type { Role } from "@/lib/auth/roles";

/**
 * How a route authenticates its caller; every route declares exactly one:
 * - `{ roles }`: a signed-in person (session cookie or bearer token) whose role is in the list;
 * - `{ feedSignature: true }`: the detector feed's HMAC over the raw body (X-Feed-Timestamp, X-Feed-Signature);
 * - `{ ackToken: true }`: a one-click acknowledge link; the signed token in the `token` path parameter is the
 *   credential, and the service that spends it checks it (a refused link must answer as a page, not as JSON);
 * - `{ anyone: true }`: no caller identity at all, for answers that are the same for everyone and reveal nothing
 *   (the JSON 404 for an unknown API path).
 */
export type Guard =
  | { roles: readonly Role[]; feedSignature?: never; ackToken?: never; anyone?: never }
  | { feedSignature: true; roles?: never; ackToken?: never; anyone?: never }
  | { ackToken: true; roles?: never; feedSignature?: never; anyone?: never }
  | { anyone: true; roles?: never; feedSignature?: never; ackToken?: never };
