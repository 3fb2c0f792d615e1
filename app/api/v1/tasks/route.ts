import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listTasks } from "@/lib/data/tasks";
import { taskListQuerySchema } from "@/lib/validations/tasks";

/** The follow-up board: `?site=&kind=&candidate=&mine=1&state=`. */
export const GET = handler({ roles: can.read, query: taskListQuerySchema }, async ({ user, query }) =>
  listTasks(query, user),
);
