/**
 * The detector network's site codes. The network is fictional (Chirpdesk's own demo scenario):
 *   N1 — "Northern array", S1 — "Southern array", E1 — "Equatorial array".
 * Set FEED_NETWORK_SITES (comma-separated, e.g. "N1,S1,E1,W1") to describe another network.
 *
 * The ingest schema accepts any short uppercase code (see `detectorCodePattern`), so a new site can post before
 * the configuration catches up; the configured list drives the fake feed and the documentation.
 */
export const defaultNetworkSites = ["N1", "S1", "E1"] as const;

/** One to four characters, an uppercase letter first, then uppercase letters or digits. */
export const detectorCodePattern = /^[A-Z][A-Z0-9]{0,3}$/;

export function networkSiteCodes(env: Record<string, string | undefined> = process.env): string[] {
  const configured = (env.FEED_NETWORK_SITES ?? "")
    .split(",")
    .map((code) => code.trim())
    .filter((code) => detectorCodePattern.test(code));
  return configured.length > 0 ? [...new Set(configured)] : [...defaultNetworkSites];
}
