import { ApiError } from "@/lib/api/errors";
import { hasRole, type Role, type SessionUser } from "./roles";

/**
 * The domain's own role check (routes check too, in handler()): a 403 naming what was refused and who may.
 * `what` completes "your role (…) may not …".
 */
export function requireRole(actor: Pick<SessionUser, "role">, allowed: readonly Role[], what: string): void {
  if (!hasRole(actor, allowed)) throw new ApiError(403, `your role (${actor.role}) may not ${what}; allowed: ${allowed.join(", ")}`);
}
