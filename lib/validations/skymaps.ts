import { z } from "zod";

/** Largest sky-map upload (raw or gzip'd), and the largest size it may expand to. */
export const maxSkymapBytes = 200 * 1024 * 1024;

/** The multipart field the file travels in (UI and feed). */
export const skymapFileField = "file";

/** GET /api/v1/skymaps/:id/cone: a cone in ICRS degrees. */
export const coneQuerySchema = z.object({
  raDeg: z.coerce.number().finite().min(0, "raDeg must be in [0, 360)").max(360, "raDeg must be in [0, 360]"),
  decDeg: z.coerce.number().finite().min(-90, "decDeg must be in [-90, 90]").max(90, "decDeg must be in [-90, 90]"),
  radiusDeg: z.coerce.number().finite().gt(0, "radiusDeg must be above 0").max(180, "radiusDeg must be at most 180"),
});
export type ConeQuery = z.infer<typeof coneQuerySchema>;

/** A sky position, for the distance at that position. */
export const positionQuerySchema = coneQuerySchema.pick({ raDeg: true, decDeg: true });

/** The 201 answer of both upload routes. */
export interface SkymapUploadAnswer {
  id: string;
  sha256: string;
  totalProbability: number;
  area50Deg2: number;
  area90Deg2: number;
  peak: { raDeg: number; decDeg: number };
  warnings: string[];
}
