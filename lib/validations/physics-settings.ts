import { z } from "zod";
import { SUN_MASS_LENGTH_M } from "@/lib/physics/constants";

/**
 * Coordinator physics settings. Ranges keep each number physical; the refinements keep them consistent with each
 * other. Defaults and their sources: lib/physics/index.ts (defaultPhysicsSettings).
 */

/**
 * Buchdahl's bound (Buchdahl 1959, Phys. Rev. 116, 1027): a static fluid star has 2GM/(Rc²) < 8/9, i.e.
 * compactness GM/(Rc²) < 4/9. A neutron star of the maximum mass and the assumed radius must obey it.
 */
export const BUCHDAHL_MAX_COMPACTNESS = 4 / 9;

export function compactness(massSolar: number, radiusKm: number): number {
  return (massSolar * SUN_MASS_LENGTH_M) / (radiusKm * 1000);
}

interface Consistent {
  nsMaxMassSolar: number;
  gapUpperMassSolar: number;
  nsRadiusKm: number;
}

function checkConsistency(value: Consistent, ctx: z.RefinementCtx) {
  if (!(value.gapUpperMassSolar > value.nsMaxMassSolar)) {
    ctx.addIssue({ code: "custom", path: ["gapUpperMassSolar"], message: `must be above nsMaxMassSolar (${value.nsMaxMassSolar} M☉)` });
  }
  const c = compactness(value.nsMaxMassSolar, value.nsRadiusKm);
  if (!(c < BUCHDAHL_MAX_COMPACTNESS)) {
    ctx.addIssue({
      code: "custom",
      path: ["nsRadiusKm"],
      message: `a ${value.nsMaxMassSolar} M☉ neutron star of ${value.nsRadiusKm} km has compactness GM/(Rc²) = ${c.toFixed(3)}, above Buchdahl's 4/9: raise the radius or lower nsMaxMassSolar`,
    });
  }
}

const fields = {
  nsMaxMassSolar: z.number("a mass in M☉").min(1, "at least 1 M☉").max(5, "at most 5 M☉"),
  gapUpperMassSolar: z.number("a mass in M☉").min(2, "at least 2 M☉").max(10, "at most 10 M☉"),
  nsRadiusKm: z.number("a radius in km").min(8, "at least 8 km").max(16, "at most 16 km"),
  sampleCount: z.number("a whole number").int("a whole number").min(1000, "at least 1 000").max(200_000, "at most 200 000"),
  chirpModel: z.enum(["pn-3.5", "leading-order"]),
  pAstroRatePerYear: z.number("a rate per year").gt(0, "above 0").max(100_000, "at most 100 000 per year"),
  pAstroSnrThreshold: z.number("an SNR").min(4, "at least 4").max(30, "at most 30"),
};

/** The stored value: a missing field (a row written before it existed) reads as its default. */
export const physicsSettingsSchema = z
  .object({
    nsMaxMassSolar: fields.nsMaxMassSolar.default(3.0),
    gapUpperMassSolar: fields.gapUpperMassSolar.default(5.0),
    nsRadiusKm: fields.nsRadiusKm.default(12),
    sampleCount: fields.sampleCount.default(20_000),
    chirpModel: fields.chirpModel.default("pn-3.5"),
    pAstroRatePerYear: fields.pAstroRatePerYear.default(50),
    pAstroSnrThreshold: fields.pAstroSnrThreshold.default(8),
  })
  .superRefine(checkConsistency);

export type PhysicsSettingsValue = z.infer<typeof physicsSettingsSchema>;

/** `PUT /api/v1/settings/physics` and the coordinator form: every field, no defaults, nothing else. */
export const physicsSettingsInputSchema = z.strictObject(fields).superRefine(checkConsistency);
export type PhysicsSettingsInput = z.infer<typeof physicsSettingsInputSchema>;
