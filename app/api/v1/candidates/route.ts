import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listCandidates } from "@/lib/data/candidates";
import { candidateListQuerySchema } from "@/lib/validations/candidates";

/** Candidates, sorted, filtered and paged on the server: `?sort=&dir=&page=&pageSize=&state=&stage=&class=&q=`. */
export const GET = handler({ roles: can.read, query: candidateListQuerySchema }, async ({ query }) =>
  listCandidates(query),
);
