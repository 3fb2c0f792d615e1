import { LineChart } from "lucide-react";
import { DeadlinesDialog } from "@/components/review/deadlines-dialog";
import { ReviewFilters, type FilterValues } from "@/components/review/review-filters";
import { ReviewView } from "@/components/review/review-view";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { loadPeople, loadShifts, loadSites } from "@/lib/data/review";
import { formatClock, formatInZone } from "@/lib/format/time";
import { reviewNowMs } from "@/lib/review/clock";
import { dayInZone, resolveRange } from "@/lib/review/range";
import { buildReviewReport } from "@/lib/services/build-review";
import { reviewSearchParams, toReviewRequest } from "@/lib/review/request";
import { reviewQuerySchema, type ReviewQuery } from "@/lib/validations/review";

export const metadata = { title: "Review" };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

export default async function ReviewPage({ searchParams }: { searchParams: SearchParams }) {
  const user = await requirePageUser();
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  const parsed = reviewQuerySchema.safeParse(raw);
  const query: ReviewQuery = parsed.success ? parsed.data : {};
  const nowMs = reviewNowMs();
  const req = toReviewRequest(query, user.timeZone, nowMs);
  const range = "error" in req ? resolveRange({}, user.timeZone, nowMs) : req;
  const { fromMs, toMs } = "error" in range ? { fromMs: nowMs, toMs: nowMs + 1 } : range;

  const [report, shifts, people, sites] = await Promise.all([
    "error" in req ? null : buildReviewReport(req),
    loadShifts(fromMs, toMs),
    loadPeople(),
    loadSites(),
  ]);
  const values: FilterValues = {
    ...query,
    from: dayInZone(fromMs, user.timeZone),
    to: dayInZone(toMs - 1, user.timeZone),
  };
  const filterQuery = reviewSearchParams(values).toString();
  const canEdit = hasRole(user, can.manageSettings);
  const problem = !parsed.success ? "Some filters were not understood and were ignored." : "error" in req ? req.error : !report ? "That shift does not exist." : null;

  return (
    <>
      <PageHeader
        title="Response-time review"
        description="How long each step took, from merger to first report, against the rota's deadlines."
        actions={report && canEdit ? <DeadlinesDialog initial={report.deadlines} /> : null}
      />
      <ReviewFilters
        values={values}
        exportQuery={filterQuery}
        timeZone={user.timeZone}
        choices={{
          shifts: shifts.map((s) => ({ id: s.id, label: `${formatInZone(s.startsAtMs, user.timeZone).slice(0, 16)}–${formatClock(s.endsAtMs, user.timeZone)} ${s.primaryName}` })),
          people: people.map((p) => ({ id: p.id, name: p.name })),
          sites,
        }}
      />
      {problem ? (
        <p role="alert" className="mb-4 rounded-md border border-warn/40 bg-warn/10 px-3 py-2 text-sm text-warn">
          {problem}
        </p>
      ) : null}
      {report && report.candidates > 0 ? (
        <ReviewView report={report} filterQuery={filterQuery} />
      ) : (
        <EmptyState icon={LineChart} title="No candidates in this range">
          Nothing was received between these days with these filters. Widen the range or clear a filter; once candidates
          have been paged, acknowledged and decided, each step&apos;s durations appear here.
        </EmptyState>
      )}
      {!canEdit ? <p className="mt-4 text-xs text-faint">Read-only: coordinators set the deadlines.</p> : null}
    </>
  );
}
