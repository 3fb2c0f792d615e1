import { z } from "zod";
import { sourceClasses, stages } from "@/db/schema/candidate-values";
import { histogramBinKeys } from "@/lib/review/histogram";
import { stepIds } from "@/lib/review/steps";
import { acknowledgeDeadlineMinutes } from "./deadlines";

export { acknowledgeDeadlineMinutes, boardAckDeadlines } from "./deadlines";

/** A calendar day (in the viewer's time zone) or an instant with its offset. */
const dayOrInstant = z.union([z.iso.date(), z.iso.datetime({ offset: true })]);
const optionalId = z.string().trim().min(1).max(100).optional();

/** Empty strings from a GET form count as absent. */
const dropEmpty = (raw: unknown) =>
  raw && typeof raw === "object"
    ? Object.fromEntries(Object.entries(raw as Record<string, unknown>).filter(([, v]) => v !== "" && v !== undefined))
    : raw;

const reviewFilters = z.object({
  from: dayOrInstant.optional(),
  to: dayOrInstant.optional(),
  class: z.enum(sourceClasses).optional(),
  stage: z.enum(stages).optional(),
  shift: optionalId,
  person: optionalId,
  site: optionalId,
});

/** Filters shared by the review page, its JSON and its CSV. */
export const reviewQuerySchema = z.preprocess(dropEmpty, reviewFilters);
export type ReviewQuery = z.infer<typeof reviewQuerySchema>;

/** The click-through list: one step, optionally one histogram bin or only the late ones. */
export const reviewListQuerySchema = z.preprocess(
  dropEmpty,
  reviewFilters.extend({
    step: z.enum(stepIds),
    bin: z.enum(histogramBinKeys).optional(),
    late: z.enum(["1", "true"]).optional(),
    week: z.iso.datetime({ offset: true }).optional(),
    limit: z.coerce.number().int().min(1).max(2000).default(200),
  }),
);
export type ReviewListQuery = z.infer<typeof reviewListQuerySchema>;

/**
 * Every deadline, in minutes, as coordinators edit them. `acknowledgeAlarmMinutes` is no longer read (the alarm is
 * the acknowledgement deadline above); it stays so stored rows and older clients keep parsing. Bounds mirror settingSchemas.deadlines in
 * lib/data/settings.ts (kept apart so the browser form does not import the database; a test checks they agree).
 */
export const deadlinesSchema = z
  .object({
    feedLatencyMinutes: z.number().min(0.1).max(60),
    pageMinutes: z.number().min(0.1).max(60),
    acknowledgeStepMinutes: z.number().min(0.5).max(240),
    decisionMinutes: z.number().min(1).max(24 * 60),
    claimMinutes: z.number().min(1).max(24 * 60),
    reportMinutes: z.number().min(1).max(7 * 24 * 60),
    acknowledgeWarnMinutes: z.number().min(0.5).max(240),
    acknowledgeAlarmMinutes: z.number().min(0.5).max(240),
    firstExposureMinutes: z.number().min(1).max(7 * 24 * 60),
    covered50Minutes: z.number().min(1).max(7 * 24 * 60),
    covered90Minutes: z.number().min(1).max(14 * 24 * 60),
  })
  .refine((d) => d.acknowledgeWarnMinutes <= acknowledgeDeadlineMinutes(d), {
    path: ["acknowledgeWarnMinutes"],
    message: "the warning must come no later than the acknowledgement deadline (paging + acknowledgement)",
  });
export type DeadlinesInput = z.infer<typeof deadlinesSchema>;
