import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { reviewNowMs } from "@/lib/review/clock";
import { getHandoffSummary } from "@/lib/review/handoff";
import { shiftIdParams } from "@/lib/validations/params";

/** GET /api/v1/review/handoff/:shiftId — the end-of-shift summary as of now (the e-mail carries the same). */
export const GET = handler({ roles: can.read, params: shiftIdParams }, async ({ params }) => {
  const summary = await getHandoffSummary(params.shiftId, reviewNowMs());
  if (!summary) throw new ApiError(404, "shift not found");
  return summary;
});
