import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { createInstrument, listInstruments } from "@/lib/instruments/service";
import { instrumentCreateSchema } from "@/lib/validations/instruments";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ instruments: await listInstruments(params.id) }));

export const POST = handler({ roles: can.manageSites, params: idParams, body: instrumentCreateSchema }, async ({ user, params, body }) =>
  NextResponse.json({ instrument: await createInstrument(user, params.id, body) }, { status: 201 }),
);
