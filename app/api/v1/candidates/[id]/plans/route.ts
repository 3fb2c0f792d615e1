import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { planFollowUp } from "@/lib/services/plan-follow-up";
import { getCandidatePlans } from "@/lib/services/read-plans";
import { idParams } from "@/lib/validations/params";
import { planRequestSchema } from "@/lib/validations/plans";

/** The candidate's pointing plans, newest first. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ plans: await getCandidatePlans(params.id) }));

/** Plans pointings for one instrument over the candidate's newest sky map and schedules them in a window. */
export const POST = handler({ roles: can.planPointings, params: idParams, body: planRequestSchema }, async ({ user, params, body, now }) =>
  NextResponse.json(await planFollowUp(user, params.id, body, now), { status: 201 }),
);
