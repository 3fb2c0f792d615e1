import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listTasks } from "@/lib/data/tasks";
import { createTasks } from "@/lib/services/create-tasks";
import { planNewTasks } from "@/lib/services/plan-new-tasks";
import { planningNow } from "@/lib/triage/clock";
import { createTasksBodySchema } from "@/lib/validations/tasks";
import { idParams } from "@/lib/validations/params";

/** The candidate's follow-up tasks. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ user, params }) => listTasks({ candidateId: params.id }, user));

/** Plans follow-up: creates one or several tasks for a candidate in Pursue; each task for a site gets a pointing plan when it can. */
export const POST = handler({ roles: can.planFollowUp, params: idParams, body: createTasksBodySchema }, async ({ user, body, params }) => {
  const now = planningNow();
  const tasks = await createTasks(user, params.id, body.tasks, now);
  const plans = await planNewTasks(user, tasks, now);
  return NextResponse.json({ tasks, plans: plans.map((p) => ({ id: p.id, taskId: p.taskId, pointings: p.pointings.length, scheduledProbability: p.scheduledProbability })) }, { status: 201 });
});
