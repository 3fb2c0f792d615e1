import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { retryFailedNotification } from "@/lib/data/paging";
import { idParams } from "@/lib/validations/params";

/** Puts a failed message back in the outbox (coordinators). */
export const POST = handler({ roles: can.retryPages, params: idParams }, async ({ user, params }) => {
  await retryFailedNotification(user, params.id);
  return { ok: true };
});
