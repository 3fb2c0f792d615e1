"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch, errorText } from "@/lib/api-client";
import { formatDec, formatDistance, formatRa } from "./format";

export interface PickedPosition {
  raDeg: number;
  decDeg: number;
}

/** The distance (mean ± sd, Mpc) in the map's pixel under a position clicked on the zoomed map. */
export function PickedDistance({ skymapId, picked }: { skymapId: string; picked: PickedPosition | null }) {
  const query = useQuery({
    queryKey: ["skymap-distance-at", skymapId, picked?.raDeg, picked?.decDeg] as const,
    enabled: Boolean(picked),
    staleTime: Number.POSITIVE_INFINITY,
    queryFn: () =>
      apiFetch<{ distance: { meanMpc: number; stdMpc: number } | null }>(
        `/api/v1/skymaps/${skymapId}/distance?raDeg=${picked?.raDeg.toFixed(4)}&decDeg=${picked?.decDeg.toFixed(4)}`,
      ),
  });
  if (!picked) return <p className="text-xs text-faint">Click the zoomed map for the distance at that position.</p>;
  const where = `RA ${formatRa(picked.raDeg)}, Dec ${formatDec(picked.decDeg)}`;
  return (
    <p className="text-sm" data-testid="picked-distance" aria-live="polite">
      <span className="text-muted">Distance at {where}: </span>
      <span className="font-mono">
        {query.isError
          ? errorText(query.error)
          : query.data
            ? query.data.distance
              ? formatDistance(query.data.distance.meanMpc, query.data.distance.stdMpc)
              : "no distance in that pixel"
            : "…"}
      </span>
    </p>
  );
}
