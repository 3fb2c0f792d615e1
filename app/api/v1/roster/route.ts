import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getRoster } from "@/lib/data/triage";

export const dynamic = "force-dynamic";

/** Who is on call now and who may own a candidate (read-only; the rota area edits shifts). */
export const GET = handler({ roles: can.read }, async () => getRoster());
