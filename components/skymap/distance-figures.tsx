import type { SkymapInfo } from "@/lib/data/skymaps";
import { formatDistance, formatShare } from "./format";

/**
 * Luminosity distance of a 3D map (Singer et al. 2016 ansatz): at the most probable position and over the whole map,
 * as mean ± standard deviation. Nothing is shown for maps without distance columns.
 */
export function DistanceFigures({ distance }: { distance: SkymapInfo["distance"] }) {
  if (!distance) return null;
  return (
    <div className="space-y-1" data-testid="skymap-distance">
      <dl className="grid grid-cols-1 gap-3 text-sm sm:grid-cols-2">
        <div className="rounded-md border border-line bg-sunken px-3 py-2">
          <dt className="text-xs text-muted">Distance at the most probable position</dt>
          <dd className="font-mono text-base" data-testid="distance-peak">
            {distance.atPeak ? formatDistance(distance.atPeak.meanMpc, distance.atPeak.stdMpc) : "no distance in that pixel"}
          </dd>
        </div>
        <div className="rounded-md border border-line bg-sunken px-3 py-2">
          <dt className="text-xs text-muted">Distance over the whole map</dt>
          <dd className="font-mono text-base" data-testid="distance-whole">
            {formatDistance(distance.meanMpc, distance.stdMpc)}
          </dd>
        </div>
      </dl>
      <p className="text-xs text-faint">
        Luminosity distance, mean ± standard deviation, from the map&apos;s per-pixel distance columns
        {distance.coveredProbability < 0.999 ? ` (pixels holding ${formatShare(distance.coveredProbability)} of the probability carry a distance)` : ""}.
      </p>
    </div>
  );
}
