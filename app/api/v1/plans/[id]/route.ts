import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getPlan } from "@/lib/services/read-plans";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => getPlan(params.id));
