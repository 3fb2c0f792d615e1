"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import { useLiveEvents } from "@/components/live/live-store";
import { moonIlluminatedFraction, moonPositionJ2000, sunPositionJ2000 } from "@/lib/astro";
import { apiFetch } from "@/lib/api-client";
import type { SkymapInfo } from "@/lib/data/skymaps";
import type { CandidateVisibility } from "@/lib/data/visibility";
import { decodeDisplayGrid, type DisplayGrid } from "@/lib/skymap/display-grid";
import { skymapKeys } from "./query-keys";

export function useCandidateSkymaps(candidateId: string) {
  const queryClient = useQueryClient();
  // another shifter or the feed may upload a map while this page is open
  useLiveEvents((event) => {
    if (event.candidateId !== candidateId) return;
    if (event.kind === "skymap.uploaded") {
      void queryClient.invalidateQueries({ queryKey: skymapKeys.list(candidateId) });
      void queryClient.invalidateQueries({ queryKey: skymapKeys.visibility(candidateId) });
    }
    if (event.kind.startsWith("task.")) void queryClient.invalidateQueries({ queryKey: skymapKeys.reports(candidateId) });
  });
  return useQuery({
    queryKey: skymapKeys.list(candidateId),
    queryFn: () => apiFetch<{ skymaps: SkymapInfo[] }>(`/api/v1/candidates/${candidateId}/skymaps`).then((r) => r.skymaps),
  });
}

export function useDisplayGrid(skymapId: string | undefined) {
  return useQuery({
    queryKey: skymapKeys.grid(skymapId ?? ""),
    enabled: Boolean(skymapId),
    staleTime: Number.POSITIVE_INFINITY, // content-addressed: never changes
    queryFn: async (): Promise<DisplayGrid> => {
      const res = await fetch(`/api/v1/skymaps/${skymapId}/display`);
      if (!res.ok) throw new Error(`display grid: ${res.status}`);
      return decodeDisplayGrid(new Uint8Array(await res.arrayBuffer()));
    },
  });
}

export function useVisibility(candidateId: string, enabled: boolean) {
  return useQuery({
    queryKey: skymapKeys.visibility(candidateId),
    enabled,
    refetchInterval: 5 * 60_000, // the coming night shortens as time passes
    queryFn: () =>
      apiFetch<{ visibility: CandidateVisibility | null }>(`/api/v1/candidates/${candidateId}/visibility`).then((r) => r.visibility),
  });
}

export interface SunMoon {
  sun: { raDeg: number; decDeg: number };
  moon: { raDeg: number; decDeg: number; illumination: number };
  at: Date;
}

/** Sun and Moon positions (J2000, geocentric; Meeus ch. 25 and 47) now, refreshed every minute. */
export function useSunMoonNow(): SunMoon | null {
  // only ever rendered in the browser (after the map list loads), so reading the clock here is safe
  const [now, setNow] = useState<Date | null>(() => new Date());
  useEffect(() => {
    const timer = setInterval(() => setNow(new Date()), 60_000);
    return () => clearInterval(timer);
  }, []);
  return useMemo(() => {
    if (!now) return null;
    const moon = moonPositionJ2000(now);
    return {
      sun: sunPositionJ2000(now),
      moon: { raDeg: moon.raDeg, decDeg: moon.decDeg, illumination: moonIlluminatedFraction(now) },
      at: now,
    };
  }, [now]);
}
