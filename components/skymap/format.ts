/** Sky coordinates and areas for people: RA in hours (common practice), declination signed in degrees. */
export function formatRa(raDeg: number): string {
  const totalSeconds = Math.round((((raDeg % 360) + 360) % 360) * 240); // 1° = 4 min of time = 240 s
  const h = Math.floor(totalSeconds / 3600) % 24;
  const m = Math.floor((totalSeconds % 3600) / 60);
  const s = totalSeconds % 60;
  return `${String(h).padStart(2, "0")}h ${String(m).padStart(2, "0")}m ${String(s).padStart(2, "0")}s`;
}

export function formatDec(decDeg: number): string {
  const sign = decDeg < 0 ? "−" : "+";
  const totalArcmin = Math.round(Math.abs(decDeg) * 60);
  return `${sign}${Math.floor(totalArcmin / 60)}° ${String(totalArcmin % 60).padStart(2, "0")}′`;
}

export function formatArea(deg2: number): string {
  if (deg2 >= 100) return `${Math.round(deg2).toLocaleString("en-US")}\u00a0deg²`;
  if (deg2 >= 10) return `${deg2.toFixed(0)}\u00a0deg²`;
  return `${deg2.toPrecision(2)}\u00a0deg²`;
}

export function formatShare(fraction: number): string {
  const pct = fraction * 100;
  if (pct > 0 && pct < 1) return "<\u00a01\u00a0%";
  return `${Math.round(pct)}\u00a0%`;
}

export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} kB`;
  return `${bytes} B`;
}

/** A distance with its spread; whole Mpc above 100 Mpc, three significant figures below. */
export function formatDistance(meanMpc: number, stdMpc: number): string {
  const fmt = (v: number) => (Math.abs(v) >= 100 ? Math.round(v).toLocaleString("en-US") : v.toPrecision(3));
  return `${fmt(meanMpc)}\u00a0±\u00a0${fmt(stdMpc)}\u00a0Mpc`;
}
