/**
 * A site's night-time observable band: the sky that reaches the site's altitude limit at some moment of its coming
 * astronomical night. A declination δ rises above altitude h for hour angles |H| ≤ H₀ with
 * cos H₀ = (sin h − sin φ sin δ) / (cos φ cos δ) (from Meeus, Astronomical Algorithms, eq. 13.6); during the night
 * the local sidereal time sweeps [LST₀, LST₀ + sweep], so right ascension α qualifies when it lies within H₀ of
 * that arc. Precession (< 0.5° from J2000 to the 2030s) is ignored: this is for drawing.
 */
export interface NightBand {
  latDeg: number;
  minAltitudeDeg: number;
  lstStartDeg: number;
  lstSweepDeg: number;
}

const DEG = Math.PI / 180;

/** Half-width (degrees of hour angle) of the time a declination spends above the limit; −1 if never, 180 if always. */
export function hourAngleAboveLimitDeg(latDeg: number, minAltitudeDeg: number, decDeg: number): number {
  const denominator = Math.cos(latDeg * DEG) * Math.cos(decDeg * DEG);
  const numerator = Math.sin(minAltitudeDeg * DEG) - Math.sin(latDeg * DEG) * Math.sin(decDeg * DEG);
  if (Math.abs(denominator) < 1e-12) return numerator <= 0 ? 180 : -1;
  const cosH0 = numerator / denominator;
  if (cosH0 > 1) return -1;
  if (cosH0 < -1) return 180;
  return Math.acos(cosH0) / DEG;
}

export function nightBandContains(band: NightBand, raDeg: number, decDeg: number): boolean {
  const h0 = hourAngleAboveLimitDeg(band.latDeg, band.minAltitudeDeg, decDeg);
  if (h0 < 0) return false;
  if (h0 >= 180 || band.lstSweepDeg + 2 * h0 >= 360) return true;
  const d = (((raDeg - band.lstStartDeg) % 360) + 360) % 360; // how far past the arc's start
  if (d <= band.lstSweepDeg) return true;
  return Math.min(d - band.lstSweepDeg, 360 - d) <= h0;
}
