"use client";

import { useQuery } from "@tanstack/react-query";
import { queryKeys } from "@/components/live/query-keys";
import { ApiClientError, apiFetch } from "@/lib/api-client";
import type { Observation } from "@/db/schema/observations";
import type { CounterpartAnswer } from "@/lib/services/report-counterpart";
import type { CoverageAnswer } from "@/lib/services/read-coverage";

/**
 * The candidate's coverage; null while it has no sky map (the route's 409). The live connection refreshes it when
 * an exposure is logged or a new map arrives (components/live/query-keys.ts).
 */
export function useCoverage(candidateId: string) {
  return useQuery({
    queryKey: queryKeys.coverage(candidateId),
    queryFn: async (): Promise<CoverageAnswer | null> => {
      try {
        return await apiFetch<CoverageAnswer>(`/api/v1/candidates/${candidateId}/coverage`);
      } catch (error) {
        if (error instanceof ApiClientError && error.status === 409) return null;
        throw error;
      }
    },
  });
}

export function useCounterparts(candidateId: string) {
  return useQuery({
    queryKey: queryKeys.counterparts(candidateId),
    queryFn: () => apiFetch<{ skymapId: string | null; counterparts: CounterpartAnswer[] }>(`/api/v1/candidates/${candidateId}/counterparts`),
  });
}

/** A logged exposure as the API sends it (times as ISO text). */
export type LoggedObservation = Omit<Observation, "startTime" | "createdAt"> & { startTime: string; createdAt: string };

export function useCandidateObservations(candidateId: string) {
  return useQuery({
    queryKey: queryKeys.observations(candidateId),
    queryFn: () => apiFetch<{ observations: LoggedObservation[] }>(`/api/v1/candidates/${candidateId}/observations`).then((r) => r.observations),
  });
}
