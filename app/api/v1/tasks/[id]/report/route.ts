import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { reportTask } from "@/lib/services/move-task";
import { taskReportBodySchema } from "@/lib/validations/tasks";
import { idParams } from "@/lib/validations/params";

/** The observer's result; the task becomes reported. Files are attached through the uploads route (sky-map issue). */
export const POST = handler({ roles: can.claimTask, params: idParams, body: taskReportBodySchema }, async ({ user, body, params }) =>
  reportTask(user, params.id, body.result),
);
