import { z } from "zod";
import { airmassToAltitudeDeg } from "@/lib/astro/coords";
import { DEFAULT_MOON_DISTANCE_DEG } from "@/lib/astro/schedule";
import { timeZoneSchema } from "./users";

/** Form values arrive as strings; empty means "not given". */
const optionalNumber = z.preprocess((v) => (v === "" || v === null ? undefined : v), z.coerce.number().finite().optional());

/**
 * A site as coordinators type it. The altitude limit is given either as the lowest usable altitude or as the
 * highest usable airmass (converted with the plane-parallel sec z, see airmassToAltitudeDeg); exactly one.
 */
export const siteFormSchema = z
  .object({
    code: z
      .string()
      .trim()
      .toUpperCase()
      .regex(/^[A-Z0-9][A-Z0-9-]{0,11}$/, "1–12 letters, digits or dashes"),
    name: z.string().trim().min(2, "at least 2 characters").max(120),
    latitudeDeg: z.coerce.number().finite().min(-90, "between −90 and 90").max(90, "between −90 and 90"),
    longitudeDeg: z.coerce.number().finite().min(-180, "between −180 and 180 (east positive)").max(180, "between −180 and 180 (east positive)"),
    elevationM: z.coerce.number().finite().min(-500, "at least −500 m").max(9000, "at most 9000 m"),
    limitKind: z.enum(["altitude", "airmass"]).default("altitude"),
    minAltitudeDeg: optionalNumber,
    maxAirmass: optionalNumber,
    moonDistanceDeg: z.preprocess(
      (v) => (v === "" || v === null ? undefined : v),
      z.coerce.number({ error: "give a number" }).finite("give a number").min(0, "between 0° and 180°").max(180, "between 0° and 180°").default(DEFAULT_MOON_DISTANCE_DEG),
    ),
    fieldOfViewDeg2: z.coerce.number().finite().gt(0, "above 0").max(41_253, "at most the whole sky (41 253 deg²)"),
    timeZone: timeZoneSchema,
    observerIds: z.array(z.string().min(1)).max(200).default([]),
  })
  .superRefine((site, ctx) => {
    if (site.limitKind === "altitude") {
      if (site.minAltitudeDeg === undefined) ctx.addIssue({ code: "custom", path: ["minAltitudeDeg"], message: "give the lowest usable altitude" });
      else if (site.minAltitudeDeg < 0 || site.minAltitudeDeg > 89) {
        ctx.addIssue({ code: "custom", path: ["minAltitudeDeg"], message: "between 0° and 89°" });
      }
    } else if (site.maxAirmass === undefined) {
      ctx.addIssue({ code: "custom", path: ["maxAirmass"], message: "give the highest usable airmass" });
    } else if (site.maxAirmass < 1.0001 || site.maxAirmass > 40) {
      ctx.addIssue({ code: "custom", path: ["maxAirmass"], message: "between 1 and 40" });
    }
  })
  .transform(({ limitKind, minAltitudeDeg, maxAirmass, ...site }) => ({
    ...site,
    minAltitudeDeg:
      limitKind === "airmass" ? Math.round(airmassToAltitudeDeg(maxAirmass ?? 2) * 100) / 100 : (minAltitudeDeg ?? 30),
  }));
export type SiteFormInput = z.input<typeof siteFormSchema>;
export type SiteInput = z.output<typeof siteFormSchema>;

/** GET /api/v1/sites/tonight: how many recent candidates to show. */
export const tonightQuerySchema = z.object({
  days: z.coerce.number().int().min(1).max(30).default(3),
  limit: z.coerce.number().int().min(1).max(50).default(10),
});
