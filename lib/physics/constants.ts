/**
 * Physical constants used across lib/physics. SI units unless the name says otherwise.
 */

/** Nominal solar mass parameter GM☉ in m³ s⁻², IAU 2015 Resolution B3. */
export const GM_SUN_M3_PER_S2 = 1.3271244e20;

/** Speed of light in m/s, exact by the SI definition of the metre. */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;

/** GM☉/c³ in seconds: one solar mass expressed as a time (IAU 2015 B3 with exact c). */
export const SUN_MASS_TIME_S = GM_SUN_M3_PER_S2 / SPEED_OF_LIGHT_M_PER_S ** 3;

/** GM☉/c² in metres: one solar mass expressed as a length (IAU 2015 B3 with exact c). */
export const SUN_MASS_LENGTH_M = GM_SUN_M3_PER_S2 / SPEED_OF_LIGHT_M_PER_S ** 2;

/** Megaparsec in metres (IAU 2015 Resolution B2 parsec, as astropy uses). */
export const MEGAPARSEC_M = 3.0856775814913673e22;

/** Speed of light in km/s (exact), for c/H0 in Mpc. */
export const SPEED_OF_LIGHT_KM_PER_S = 299_792.458;

/** Newtonian constant of gravitation in m³ kg⁻¹ s⁻², CODATA 2018 (used only for the photon density). */
export const NEWTON_G_SI = 6.6743e-11;

/** Stefan–Boltzmann constant in W m⁻² K⁻⁴, CODATA 2018 (exact-derived). */
export const STEFAN_BOLTZMANN_SI = 5.670374419e-8;

/** Boltzmann constant in eV/K, CODATA 2018 (exact-derived). */
export const BOLTZMANN_EV_PER_K = 8.617333262e-5;
