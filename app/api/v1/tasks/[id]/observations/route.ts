import { NextResponse } from "next/server";
import { notFound } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listTaskObservations } from "@/lib/data/observations";
import { recordObservations } from "@/lib/services/record-observations";
import { observationsBodySchema } from "@/lib/validations/observations";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => {
  const observations = await listTaskObservations(params.id);
  if (!observations) throw notFound("task");
  return { observations };
});

/** Logs 1–1000 exposures for a task: all stored, or (one bad row → 422 naming row and field) none. */
export const POST = handler({ roles: can.recordObservations, params: idParams, body: observationsBodySchema }, async ({ user, params, body, now }) =>
  NextResponse.json(await recordObservations(user, params.id, body.observations, { now, via: "api" }), { status: 201 }),
);
