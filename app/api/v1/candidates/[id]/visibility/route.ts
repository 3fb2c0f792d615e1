import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { candidateVisibility } from "@/lib/data/visibility";
import { idParams } from "@/lib/validations/params";

/** What each site can observe of the candidate's newest sky map during its coming astronomical night. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({
  visibility: await candidateVisibility(params.id, new Date()),
}));
