import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getBoard } from "@/lib/data/candidates";

export const dynamic = "force-dynamic";

/** The triage board: every card, the acknowledgement deadlines and the server clock. */
export const GET = handler({ roles: can.read }, async () => getBoard());
