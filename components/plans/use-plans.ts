"use client";

import { useQuery } from "@tanstack/react-query";
import { queryKeys } from "@/components/live/query-keys";
import { apiFetch } from "@/lib/api-client";
import type { PlanRecord } from "@/lib/plans/record";

/** A candidate's pointing plans, newest first; live events for plans refresh them (components/live). */
export function useCandidatePlans(candidateId: string, initialPlans?: PlanRecord[]) {
  return useQuery({
    queryKey: queryKeys.plans(candidateId),
    queryFn: async () => (await apiFetch<{ plans: PlanRecord[] }>(`/api/v1/candidates/${candidateId}/plans`)).plans,
    initialData: initialPlans,
    staleTime: 30_000,
  });
}
