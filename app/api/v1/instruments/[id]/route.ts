import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { deleteInstrument, getInstrument, patchInstrument } from "@/lib/instruments/service";
import { instrumentPatchSchema } from "@/lib/validations/instruments";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ instrument: await getInstrument(params.id) }));

export const PATCH = handler({ roles: can.manageSites, params: idParams, body: instrumentPatchSchema }, async ({ user, params, body }) => ({
  instrument: await patchInstrument(user, params.id, body),
}));

export const DELETE = handler({ roles: can.manageSites, params: idParams }, async ({ user, params }) => {
  await deleteInstrument(user, params.id);
  return { deleted: true };
});
