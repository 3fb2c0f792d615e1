import { notFound } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getCandidateDetail } from "@/lib/data/candidate-detail";
import { idParams } from "@/lib/validations/params";

/** One candidate: the ingest answer's shape ({ id, revision, derived }) plus state, revisions, tasks and payload. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => {
  const detail = await getCandidateDetail(params.id);
  if (!detail) throw notFound("candidate");
  return detail;
});
