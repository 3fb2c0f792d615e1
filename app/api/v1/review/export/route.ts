import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { reviewNowMs } from "@/lib/review/clock";
import { reviewCsv } from "@/lib/review/csv";
import { dayInZone } from "@/lib/review/range";
import { loadReviewScope } from "@/lib/review/report";
import { toReviewRequest } from "@/lib/review/request";
import { reviewQuerySchema } from "@/lib/validations/review";

/** GET /api/v1/review/export — the per-candidate table as CSV (RFC 4180), same filters as the page. */
export const GET = handler({ roles: can.read, query: reviewQuerySchema }, async ({ user, query }) => {
  const req = toReviewRequest(query, user.timeZone, reviewNowMs());
  if ("error" in req) throw new ApiError(422, req.error);
  const scope = await loadReviewScope(req);
  if (!scope) throw new ApiError(404, "shift not found");
  const name = `chirpdesk-review-${dayInZone(scope.fromMs, user.timeZone)}-to-${dayInZone(scope.toMs - 1, user.timeZone)}.csv`;
  return new Response(reviewCsv(scope.rows), {
    headers: {
      "content-type": "text/csv; charset=utf-8; header=present",
      "content-disposition": `attachment; filename="${name}"`,
      "cache-control": "no-store",
    },
  });
});
