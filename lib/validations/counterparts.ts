import { z } from "zod";

/** POST /api/v1/candidates/{id}/counterparts: a transient found in follow-up. */
export const counterpartBodySchema = z
  .object({
    raDeg: z.number().finite().min(0, "at least 0°").lt(360, "below 360°"),
    decDeg: z.number().finite().min(-90, "at least −90°").max(90, "at most 90°"),
    observedAt: z.iso.datetime({ offset: true, message: "an ISO 8601 time with a zone, e.g. 2026-12-04T05:10:00Z" }),
    magnitude: z.number().finite().min(-5, "at least −5").max(35, "at most 35").optional(),
    magnitudeError: z.number().finite().gt(0, "above 0").max(10, "at most 10").optional(),
    filter: z.string().trim().min(1, "must not be empty").max(20, "at most 20 characters").optional(),
    name: z.string().trim().min(1, "must not be empty").max(80, "at most 80 characters").optional(),
    notes: z.string().trim().max(4000, "at most 4000 characters"),
  })
  .strict()
  .superRefine((c, ctx) => {
    if (c.magnitudeError !== undefined && c.magnitude === undefined) {
      ctx.addIssue({ code: "custom", path: ["magnitudeError"], message: "give the magnitude it belongs to" });
    }
  });
export type CounterpartBody = z.output<typeof counterpartBodySchema>;
