import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listCandidateCounterparts, reportCounterpart } from "@/lib/services/report-counterpart";
import { counterpartBodySchema } from "@/lib/validations/counterparts";
import { idParams } from "@/lib/validations/params";

/** The candidate's counterparts, each with its searched probability and area on the newest sky map. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => listCandidateCounterparts(params.id));

/** Reports a transient; 201 with the stored row plus its searched region (a warning outside the 99.9 % region). */
export const POST = handler({ roles: can.reportCounterparts, params: idParams, body: counterpartBodySchema }, async ({ user, params, body, now }) =>
  NextResponse.json(await reportCounterpart(user, params.id, body, now), { status: 201 }),
);
