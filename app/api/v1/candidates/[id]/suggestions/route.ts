import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { suggestTasks } from "@/lib/data/visibility";
import { idParams } from "@/lib/validations/params";

/** Suggested follow-up tasks for the planning dialog: the sites with the most observable probability. */
export const GET = handler({ roles: can.planFollowUp, params: idParams }, async ({ params }) => suggestTasks(params.id, new Date()));
