import { z } from "zod";
import { planAvoidModes } from "@/db/schema/plans";

/** Longest window a plan may span: two nights at most (a drill or a replay is one night). */
export const maxPlanWindowHours = 48;
export const maxPlanPointings = 500;
export const defaultPlanLevel = 0.9;

/** An instant with its zone (`2030-03-20T23:00:00Z`, `…+02:00`), as a Date. */
const isoInstant = z.iso.datetime({ offset: true, message: "an ISO 8601 date and time with its zone, e.g. 2030-03-20T23:00:00Z" }).transform((s) => new Date(s));

/** POST /api/v1/candidates/{id}/plans. The service fills the window's defaults from the site's coming night. */
export const planRequestSchema = z
  .strictObject({
    instrumentId: z.string({ error: "name the instrument" }).trim().min(1, "name the instrument").max(200),
    level: z.number({ error: "a number from 0.5 to 0.99" }).min(0.5, "at least 0.5").max(0.99, "at most 0.99").default(defaultPlanLevel),
    maxPointings: z
      .number({ error: `a whole number from 1 to ${maxPlanPointings}` })
      .int("a whole number")
      .min(1, "at least 1")
      .max(maxPlanPointings, `at most ${maxPlanPointings}`)
      .default(maxPlanPointings),
    start: isoInstant.optional(),
    end: isoInstant.optional(),
    exposureS: z.number().int("whole seconds").min(1, "at least 1 s").max(86_400, "at most 86 400 s").optional(),
    filter: z.string().trim().min(1, "must not be empty").max(20, "at most 20 characters").optional(),
    avoid: z.enum(planAvoidModes, { error: `one of ${planAvoidModes.join(", ")}` }).default("planned-and-observed"),
    /** Attach the plan to this follow-up task (its site's instrument; its window by default); replaces its earlier plan. */
    taskId: z.string().trim().min(1, "must not be empty").max(200).optional(),
  })
  .superRefine((body, ctx) => {
    const issue = body.start && body.end ? windowIssue(body.start, body.end) : null;
    if (issue) ctx.addIssue({ code: "custom", path: ["end"], message: issue });
  });
export type PlanRequestInput = z.input<typeof planRequestSchema>;
export type PlanRequest = z.output<typeof planRequestSchema>;

/** What is wrong with a window, or null: `end` must come after `start`, at most 48 h later. */
export function windowIssue(start: Date, end: Date): string | null {
  if (end.getTime() <= start.getTime()) return "the window must end after it starts";
  if (end.getTime() - start.getTime() > maxPlanWindowHours * 3_600_000) return `the window may span at most ${maxPlanWindowHours} h`;
  return null;
}

export const planExportFormats = ["csv", "json"] as const;
export type PlanExportFormat = (typeof planExportFormats)[number];

/** GET /api/v1/plans/{id}/export?format=csv|json (csv when absent). */
export const planExportQuerySchema = z.object({
  format: z.enum(planExportFormats, { error: "csv or json" }).default("csv"),
});

/** PATCH /api/v1/plans/{id}/pointings/{pointingId}: tick a pointing done, or take the tick back. */
export const pointingTickSchema = z.strictObject({ done: z.boolean({ error: "true or false" }) });
export type PointingTick = z.output<typeof pointingTickSchema>;

const segment = z.string().min(1, "must not be empty").max(200, "must be at most 200 characters");
export const planPointingParams = z.object({ id: segment, pointingId: segment });
