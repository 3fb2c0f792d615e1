import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { reviewNowMs } from "@/lib/review/clock";
import { buildReviewReport } from "@/lib/services/build-review";
import { toReviewRequest } from "@/lib/review/request";
import { reviewQuerySchema } from "@/lib/validations/review";

/**
 * GET /api/v1/review?from=&to=&class=&stage=&shift=&person=&site= — per-step figures, histograms, weekly trend,
 * per-shift and per-person tables. Days are in the caller's time zone; durations in ms. Bearer tokens welcome.
 */
export const GET = handler({ roles: can.read, query: reviewQuerySchema }, async ({ user, query }) => {
  const req = toReviewRequest(query, user.timeZone, reviewNowMs());
  if ("error" in req) throw new ApiError(422, req.error);
  const report = await buildReviewReport(req);
  if (!report) throw new ApiError(404, "shift not found");
  return report;
});
