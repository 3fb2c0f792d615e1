import { config, type Config } from "@/lib/env";

/**
 * The detector network's site codes. The network is fictional (Chirpdesk's own demo scenario):
 *   N1 — "Northern array", S1 — "Southern array", E1 — "Equatorial array".
 * Set FEED_NETWORK_SITES (comma-separated, e.g. "N1,S1,E1,W1") to describe another network.
 *
 * The ingest schema accepts any short uppercase code (see `detectorCodePattern`), so a new site can post before
 * the configuration catches up; the configured list drives the fake feed and the documentation.
 */
export const defaultNetworkSites = ["N1", "S1", "E1"] as const;

export { detectorCodePattern } from "./detector-code";

export function networkSiteCodes(settings: Pick<Config, "FEED_NETWORK_SITES"> = config()): string[] {
  return settings.FEED_NETWORK_SITES ? [...settings.FEED_NETWORK_SITES] : [...defaultNetworkSites];
}
