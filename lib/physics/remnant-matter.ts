/**
 * Remnant-matter fraction for the trigger's mean masses, shown with the assumptions it makes: Foucart, Hinderer &
 * Nissanke 2018 Eq. 4 (tidal-disruption.ts) for the lighter body as a neutron star of the configured radius and
 * the heavier as a black hole with its aligned spin. Source-frame masses m/(1 + z).
 */
import { fail, succeed, type PhysicsResult } from "./result";
import { remnantMassFraction } from "./tidal-disruption";

export interface RemnantMatterEstimate {
  /** M_rem / M_NS (baryonic), FHN 2018 Eq. 4 */
  massFraction: number;
  nsRadiusKm: number;
  blackHoleSpin: number;
  blackHoleMassSourceFrame: number;
  neutronStarMassSourceFrame: number;
  spinsAssumed: boolean;
}

export interface RemnantMatterInput {
  mass1DetectorFrame: number;
  mass2DetectorFrame: number;
  chi1: number;
  chi2: number;
  spinsAssumed: boolean;
  redshift: number;
  nsMaxMassSolar: number;
  nsRadiusKm: number;
}

export function estimateRemnantMatter(input: RemnantMatterInput): PhysicsResult<RemnantMatterEstimate> {
  const heavyFirst = input.mass1DetectorFrame >= input.mass2DetectorFrame;
  const heavy = (heavyFirst ? input.mass1DetectorFrame : input.mass2DetectorFrame) / (1 + input.redshift);
  const light = (heavyFirst ? input.mass2DetectorFrame : input.mass1DetectorFrame) / (1 + input.redshift);
  const spin = heavyFirst ? input.chi1 : input.chi2;
  if (!(light < input.nsMaxMassSolar)) return fail("missing-input", "the lighter mean mass is above the neutron-star maximum: no neutron star to disrupt");
  if (heavy < input.nsMaxMassSolar) return fail("missing-input", "both mean masses are below the neutron-star maximum: Eq. 4 is for a black hole–neutron star pair");
  return succeed({
    massFraction: remnantMassFraction(heavy, light, spin, input.nsRadiusKm),
    nsRadiusKm: input.nsRadiusKm,
    blackHoleSpin: spin,
    blackHoleMassSourceFrame: heavy,
    neutronStarMassSourceFrame: light,
    spinsAssumed: input.spinsAssumed,
  });
}
