import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { moveTask } from "@/lib/services/move-task";
import { taskStateBodySchema } from "@/lib/validations/tasks";
import { idParams } from "@/lib/validations/params";

/** Release (→ open), start observing (→ observing) or cancel (→ cancelled, with a reason). Roles checked per move. */
export const POST = handler(
  { roles: [...new Set([...can.claimTask, ...can.planFollowUp])], params: idParams, body: taskStateBodySchema },
  async ({ user, body, params }) => ({
    task: await moveTask({
      actor: user,
      taskId: params.id,
      to: body.to,
      reason: body.reason,
      expectedVersion: body.expectedVersion,
    }),
  }),
);
