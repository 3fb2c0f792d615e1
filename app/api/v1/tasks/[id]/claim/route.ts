import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { claimTask } from "@/lib/data/tasks";

/** Claims an open task; when someone was quicker: 409 `{ error, claimedBy: { id, name } }`. */
export const POST = handler({ roles: can.claimTask }, async ({ user, params }) => ({
  task: await claimTask(user, params.id ?? ""),
}));
