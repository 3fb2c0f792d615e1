import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { retryFailedNotification } from "@/lib/data/paging";

/** Puts a failed message back in the outbox (coordinators). */
export const POST = handler({ roles: can.readDeadLetters }, async ({ user, params }) => {
  await retryFailedNotification(user, params.id ?? "");
  return { ok: true };
});
