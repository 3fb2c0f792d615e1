import { notFound } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listCandidateLog } from "@/lib/data/observations";
import { idParams } from "@/lib/validations/params";

/** Every exposure logged for the candidate (what the sky views draw as observed footprints), oldest start first. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => {
  const observations = await listCandidateLog(params.id);
  if (!observations) throw notFound("candidate");
  return { observations };
});
