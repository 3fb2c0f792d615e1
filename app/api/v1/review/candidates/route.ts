import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { reviewNowMs } from "@/lib/review/clock";
import { listReviewCandidates } from "@/lib/review/list";
import { toListOptions, toReviewRequest } from "@/lib/review/request";
import { reviewListQuerySchema } from "@/lib/validations/review";

/**
 * GET /api/v1/review/candidates?step=acknowledge[&bin=b5|&late=1|&week=<ISO>] plus the review filters — the
 * candidates behind one bar of a chart, slowest first.
 */
export const GET = handler({ roles: can.read, query: reviewListQuerySchema }, async ({ user, query }) => {
  const req = toReviewRequest(query, user.timeZone, reviewNowMs());
  if ("error" in req) throw new ApiError(422, req.error);
  const list = await listReviewCandidates(req, toListOptions(query));
  if (!list) throw new ApiError(404, "shift not found");
  return list;
});
