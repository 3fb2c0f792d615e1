import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listCandidateReports } from "@/lib/data/uploads";
import { reportListQuerySchema } from "@/lib/validations/uploads";

/** A candidate's observation reports with their files: GET /api/v1/reports?candidateId=… */
export const GET = handler({ roles: can.read, query: reportListQuerySchema }, async ({ query }) => ({
  reports: await listCandidateReports(query.candidateId),
}));
