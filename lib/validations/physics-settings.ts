import { z } from "zod";

/**
 * Coordinator physics settings. Ranges keep each number physical; the refinements keep them consistent with each
 * other (a neutron-star maximum below the gap's upper edge, a threshold SNR the feed can report). Defaults and
 * their sources: lib/physics/index.ts (defaultPhysicsSettings).
 */
export const physicsSettingsSchema = z
  .object({
    nsMaxMassSolar: z.number().min(1).max(5).default(3.0),
    gapUpperMassSolar: z.number().min(2).max(10).default(5.0),
    nsRadiusKm: z.number().min(8).max(16).default(12),
    sampleCount: z.number().int().min(1000).max(200_000).default(20_000),
    chirpModel: z.enum(["pn-3.5", "leading-order"]).default("pn-3.5"),
    pAstroRatePerYear: z.number().gt(0).max(100_000).default(50),
    pAstroSnrThreshold: z.number().min(4).max(30).default(8),
  })
  .superRefine((value, ctx) => {
    if (!(value.gapUpperMassSolar > value.nsMaxMassSolar)) {
      ctx.addIssue({ code: "custom", path: ["gapUpperMassSolar"], message: `must be above nsMaxMassSolar (${value.nsMaxMassSolar} M☉)` });
    }
  });

export type PhysicsSettingsValue = z.infer<typeof physicsSettingsSchema>;
