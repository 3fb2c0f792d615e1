import type { ReviewListQuery, ReviewQuery } from "@/lib/validations/review";
import { resolveRange } from "./range";
import type { ReviewRequest } from "./report";
import type { StepListOptions } from "./list";

/** Filters from the query string (already parsed by zod) to a review request; an impossible range is an error string. */
export function toReviewRequest(query: ReviewQuery, timeZone: string, nowMs: number): ReviewRequest | { error: string } {
  const range = resolveRange(query, timeZone, nowMs);
  if ("error" in range) return range;
  return {
    ...range,
    sourceClass: query.class,
    stage: query.stage,
    siteId: query.site,
    shiftId: query.shift,
    personId: query.person,
    timeZone,
    nowMs,
  };
}

export function toListOptions(query: ReviewListQuery): StepListOptions {
  return {
    step: query.step,
    bin: query.bin,
    late: query.late !== undefined,
    weekStartMs: query.week ? Date.parse(query.week) : undefined,
    limit: query.limit,
  };
}

/** The filters as a query string (for links between the page, the CSV and the click-through list). */
export function reviewSearchParams(query: Partial<Record<keyof ReviewQuery, string | undefined>>): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value) params.set(key, value);
  return params;
}
