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

/** Form values arrive as strings; empty means "not given". */
const formNumber = <T extends z.ZodType>(rule: T) => z.preprocess((v) => (typeof v === "string" ? (v.trim() === "" ? undefined : Number(v)) : v), rule);
const required = <T extends z.ZodType<unknown, number>>(rule: T) => formNumber(z.number({ error: "give a number" }).pipe(rule));

/**
 * The instrument form on the sites page: the same field rules as the API, with the footprint flattened into a
 * shape and its sizes, and the filters typed as one comma-separated line. Its output is an InstrumentCreate body.
 */
export const instrumentFormSchema = z
  .object({
    name: fields.name,
    shape: z.enum(["rectangle", "circle"]),
    widthDeg: formNumber(z.number({ error: "give a number" }).optional()),
    heightDeg: formNumber(z.number({ error: "give a number" }).optional()),
    radiusDeg: formNumber(z.number({ error: "give a number" }).optional()),
    filters: z.string().max(500, "at most 500 characters"),
    exposureS: required(fields.exposureS),
    overheadS: required(fields.overheadS),
    limitingMag: formNumber(z.number({ error: "give a number" }).pipe(fields.limitingMag.unwrap()).optional()),
  })
  .transform(({ shape, widthDeg, heightDeg, radiusDeg, filters, limitingMag, ...rest }, ctx) => {
    const footprint = shape === "rectangle" ? { shape, widthDeg, heightDeg } : { shape, radiusDeg };
    const parsed = footprintSchema.safeParse(footprint);
    const filterList = filters.split(",").map((f) => f.trim()).filter((f) => f !== "");
    const parsedFilters = fields.filters.safeParse(filterList);
    for (const issue of parsed.error?.issues ?? []) {
      // A size the chosen shape needs but the form left empty arrives as undefined: say so in the form's words.
      ctx.addIssue({ code: "custom", path: [String(issue.path.at(-1) ?? "shape")], message: issue.code === "invalid_type" ? "give a number" : issue.message });
    }
    for (const issue of parsedFilters.error?.issues ?? []) ctx.addIssue({ code: "custom", path: ["filters"], message: issue.message });
    if (!parsed.success || !parsedFilters.success) return z.NEVER;
    return { ...rest, footprint: parsed.data, filters: parsedFilters.data, limitingMag: limitingMag ?? null };
  });
export type InstrumentFormInput = z.input<typeof instrumentFormSchema>;
export type InstrumentFormOutput = z.output<typeof instrumentFormSchema>;
