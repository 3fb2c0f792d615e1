import { z } from "zod";

/** Largest footprint side we accept: beyond 90° the gnomonic de-projection of a rectangle is undefined. */
const sideDeg = z.number().finite().gt(0, "above 0").lt(90, "below 90°");

export const footprintSchema = z.discriminatedUnion("shape", [
  z.object({ shape: z.literal("rectangle"), widthDeg: sideDeg, heightDeg: sideDeg }).strict(),
  z.object({ shape: z.literal("circle"), radiusDeg: z.number().finite().gt(0, "above 0").max(90, "at most 90°") }).strict(),
]);

const fields = {
  name: z.string().trim().min(1, "must not be empty").max(80, "at most 80 characters"),
  footprint: footprintSchema,
  filters: z.array(z.string().trim().min(1, "must not be empty").max(20, "at most 20 characters")).max(20, "at most 20 filters"),
  exposureS: z.number().int("whole seconds").min(1, "at least 1 s").max(86_400, "at most 86 400 s"),
  overheadS: z.number().int("whole seconds").min(0, "at least 0 s").max(3_600, "at most 3 600 s"),
  limitingMag: z.number().finite().min(-5, "at least −5").max(35, "at most 35").nullable(),
};

/** POST /api/v1/sites/{id}/instruments: every field but the limiting magnitude is required. */
export const instrumentCreateSchema = z
  .object({ ...fields, filters: fields.filters.default([]), limitingMag: fields.limitingMag.default(null) })
  .strict();
export type InstrumentCreate = z.output<typeof instrumentCreateSchema>;

/** PATCH /api/v1/instruments/{id}: any subset, at least one field. */
export const instrumentPatchSchema = z
  .object(fields)
  .partial()
  .strict()
  .refine((p) => Object.keys(p).length > 0, { message: "give at least one field to change" });
export type InstrumentPatch = z.output<typeof instrumentPatchSchema>;

/** Area of a footprint on the sky in deg² (exact spherical area, not the flat w·h). */
export function footprintAreaDeg2(f: z.output<typeof footprintSchema>): number {
  const rad = Math.PI / 180;
  const sr =
    f.shape === "circle"
      ? 2 * Math.PI * (1 - Math.cos(f.radiusDeg * rad))
      : // Solid angle of a rectangular pyramid (the gnomonic rectangle): 4·asin(sin(w/2)·sin(h/2)).
        4 * Math.asin(Math.sin((f.widthDeg * rad) / 2) * Math.sin((f.heightDeg * rad) / 2));
  return sr / (rad * rad);
}
