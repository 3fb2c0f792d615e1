import type { Role } from "@/lib/auth/roles";

/**
 * How a route authenticates its caller; every route declares exactly one:
 * - `{ roles }`: a signed-in person (session cookie or bearer token) whose role is in the list;
 * - `{ feedSignature: true }`: the detector feed's HMAC over the raw body (X-Feed-Timestamp, X-Feed-Signature);
 * - `{ ackToken: true }`: a one-click acknowledge link; the signed token in the `token` path parameter is the
 *   credential, and the service that spends it checks it (a refused link must answer as a page, not as JSON).
 */
export type Guard =
  | { roles: readonly Role[]; feedSignature?: never; ackToken?: never }
  | { feedSignature: true; roles?: never; ackToken?: never }
  | { ackToken: true; roles?: never; feedSignature?: never };
