import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { claimTask } from "@/lib/services/claim-task";
import { idParams } from "@/lib/validations/params";

/** Claims an open task; when someone was quicker: 409 `{ error, claimedBy: { id, name } }`. */
export const POST = handler({ roles: can.claimTask, params: idParams }, async ({ user, params }) => ({
  task: await claimTask(user, params.id),
}));
