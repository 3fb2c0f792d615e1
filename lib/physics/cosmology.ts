/**
 * Flat ΛCDM distances with photons and neutrinos treated as astropy's FLRW classes do: photon density from
 * T_CMB, neutrino density from the fitting function of Komatsu et al. 2011 (ApJS 192, 18, Eq. 26).
 * Default parameters: Planck 2018 (Planck Collaboration 2020, A&A 641, A6, Table 2 "TT,TE,EE+lowE+lensing+BAO"),
 * as in astropy's Planck18. Distances in Mpc, redshift dimensionless.
 */
import {
  BOLTZMANN_EV_PER_K,
  MEGAPARSEC_M,
  NEWTON_G_SI,
  SPEED_OF_LIGHT_KM_PER_S,
  SPEED_OF_LIGHT_M_PER_S,
  STEFAN_BOLTZMANN_SI,
} from "./constants";

export interface FlatLambdaCdmParameters {
  hubbleConstantKmPerSPerMpc: number;
  /** Non-relativistic matter today (baryons + cold dark matter, massive neutrinos excluded, as astropy's Om0). */
  omegaMatter0: number;
  /** CMB temperature today in K; 0 switches photons and neutrinos off. */
  cmbTemperatureK: number;
  effectiveNeutrinoNumber: number;
  neutrinoMassesEv: readonly number[];
}

/** Planck 2018 parameters exactly as astropy's Planck18 realisation. */
export const planck18: FlatLambdaCdmParameters = {
  hubbleConstantKmPerSPerMpc: 67.66,
  omegaMatter0: 0.30966,
  cmbTemperatureK: 2.7255,
  effectiveNeutrinoNumber: 3.046,
  neutrinoMassesEv: [0, 0, 0.06],
};

/** 7/8 (4/11)^(4/3): energy density of one massless neutrino species relative to photons. */
const NEUTRINO_PHOTON_RATIO = (7 / 8) * (4 / 11) ** (4 / 3);
/** Komatsu et al. 2011 Eq. 26: A = 180 ζ(3) / (7 π⁴) and p = 1.83. */
const KOMATSU_A = 0.3173;
const KOMATSU_P = 1.83;

export interface DensityParameters {
  omegaMatter0: number;
  omegaPhoton0: number;
  omegaNeutrino0: number;
  omegaDarkEnergy0: number;
  /** m_ν / (k_B T_ν0) for each massive species. */
  neutrinoMassOverTemperature: number[];
  masslessNeutrinoCount: number;
}

/** Present-day densities of a flat universe: Ω_γ = (4σ T⁴/c³) / (3 H0² / 8πG), Ω_Λ = 1 − Ω_m − Ω_γ − Ω_ν. */
export function densityParameters(params: FlatLambdaCdmParameters): DensityParameters {
  const h0PerS = (params.hubbleConstantKmPerSPerMpc * 1000) / MEGAPARSEC_M;
  const criticalDensityKgM3 = (3 * h0PerS * h0PerS) / (8 * Math.PI * NEWTON_G_SI);
  const photonDensityKgM3 = (4 * STEFAN_BOLTZMANN_SI * params.cmbTemperatureK ** 4) / SPEED_OF_LIGHT_M_PER_S ** 3;
  const omegaPhoton0 = photonDensityKgM3 / criticalDensityKgM3;
  const neutrinoTemperatureK = (4 / 11) ** (1 / 3) * params.cmbTemperatureK;
  const massive = params.neutrinoMassesEv.filter((m) => m > 0);
  const partial: DensityParameters = {
    omegaMatter0: params.omegaMatter0,
    omegaPhoton0,
    omegaNeutrino0: 0,
    omegaDarkEnergy0: 0,
    neutrinoMassOverTemperature: massive.map((m) => m / (BOLTZMANN_EV_PER_K * neutrinoTemperatureK)),
    masslessNeutrinoCount: params.neutrinoMassesEv.length - massive.length,
  };
  const perSpecies = params.neutrinoMassesEv.length > 0 ? params.effectiveNeutrinoNumber / params.neutrinoMassesEv.length : 0;
  const neutrinoFactor = (z: number) => neutrinoRelativeDensity(partial, perSpecies, z);
  const omegaNeutrino0 = params.cmbTemperatureK > 0 ? omegaPhoton0 * neutrinoFactor(0) : 0;
  return { ...partial, omegaNeutrino0, omegaDarkEnergy0: 1 - params.omegaMatter0 - omegaPhoton0 - omegaNeutrino0 };
}

/** ρ_ν/ρ_γ at redshift z, Komatsu et al. 2011 Eq. 26 (massive species) plus massless species at 7/8 (4/11)^(4/3). */
function neutrinoRelativeDensity(d: DensityParameters, effectivePerSpecies: number, z: number): number {
  let relativisticSpecies = d.masslessNeutrinoCount;
  for (const y of d.neutrinoMassOverTemperature) {
    relativisticSpecies += (1 + ((KOMATSU_A * y) / (1 + z)) ** KOMATSU_P) ** (1 / KOMATSU_P);
  }
  return NEUTRINO_PHOTON_RATIO * effectivePerSpecies * relativisticSpecies;
}

/** Dimensionless Hubble rate E(z) = H(z)/H0 of a flat ΛCDM universe with radiation (Friedmann equation). */
export function createHubbleRate(params: FlatLambdaCdmParameters): (z: number) => number {
  const d = densityParameters(params);
  const perSpecies = params.neutrinoMassesEv.length > 0 ? params.effectiveNeutrinoNumber / params.neutrinoMassesEv.length : 0;
  return (z: number) => {
    const zp1 = 1 + z;
    const radiation = d.omegaPhoton0 > 0 ? d.omegaPhoton0 * (1 + neutrinoRelativeDensity(d, perSpecies, z)) : 0;
    return Math.sqrt(zp1 * zp1 * zp1 * (d.omegaMatter0 + radiation * zp1) + d.omegaDarkEnergy0);
  };
}

/** c/H0 in Mpc. */
export function hubbleDistanceMpc(params: FlatLambdaCdmParameters): number {
  return SPEED_OF_LIGHT_KM_PER_S / params.hubbleConstantKmPerSPerMpc;
}
