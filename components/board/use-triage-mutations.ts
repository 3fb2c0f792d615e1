"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import type { Candidate, TriageState } from "@/db/schema/candidates";
import { apiFetch } from "@/lib/api-client";
import type { BoardCard, BoardData } from "@/lib/data/candidates";
import type { RosterPerson } from "@/lib/data/triage";
import { triageLabels, type TriageVia } from "@/lib/triage/transitions";
import { toastRefusal } from "./mutation-errors";

interface MoveVars {
  card: BoardCard;
  to: TriageState;
  reason?: string;
  via: TriageVia;
}

interface AssignVars {
  card: BoardCard;
  person: RosterPerson | null;
  via: TriageVia;
}

type Result = { candidate: Candidate };

function patchCard(data: BoardData | undefined, id: string, patch: (card: BoardCard) => BoardCard): BoardData | undefined {
  if (!data) return data;
  return { ...data, cards: data.cards.map((c) => (c.id === id ? patch(c) : c)) };
}

/** Triage moves and assignments with optimistic updates on the board cache, rolled back with a message on refusal. */
export function useTriageMutations() {
  const queryClient = useQueryClient();

  const optimistic = async (id: string, patch: (card: BoardCard) => BoardCard) => {
    await queryClient.cancelQueries({ queryKey: queryKeys.board });
    const previous = queryClient.getQueryData<BoardData>(queryKeys.board);
    queryClient.setQueryData<BoardData>(queryKeys.board, (data) => patchCard(data, id, patch));
    return { previous };
  };
  const confirm = (result: Result) =>
    queryClient.setQueryData<BoardData>(queryKeys.board, (data) =>
      patchCard(data, result.candidate.id, (c) => ({ ...c, version: result.candidate.version, triageState: result.candidate.triageState })),
    );
  const settle = () => queryClient.invalidateQueries({ queryKey: queryKeys.board });

  const move = useMutation({
    mutationFn: ({ card, to, reason, via }: MoveVars) =>
      apiFetch<Result>(`/api/v1/candidates/${card.id}/triage`, {
        method: "POST",
        json: { to, reason, via, expectedVersion: card.version },
      }),
    onMutate: ({ card, to }) =>
      optimistic(card.id, (c) => ({ ...c, triageState: to, updatedAt: Date.now(), acknowledgedAt: c.acknowledgedAt ?? Date.now() })),
    onError: (error, _vars, context) => {
      if (context?.previous) queryClient.setQueryData(queryKeys.board, context.previous);
      toastRefusal(error, "Moving the candidate");
    },
    onSuccess: (result, { card, to }) => {
      confirm(result);
      toast.success(`${card.externalId} → ${triageLabels[to]}`);
    },
    onSettled: settle,
  });

  const assign = useMutation({
    mutationFn: ({ card, person, via }: AssignVars) =>
      apiFetch<Result>(`/api/v1/candidates/${card.id}/assign`, {
        method: "POST",
        json: { ownerId: person?.id ?? null, via, expectedVersion: card.version },
      }),
    onMutate: ({ card, person }) =>
      optimistic(card.id, (c) => ({ ...c, owner: person ? { id: person.id, name: person.name, initials: person.initials } : null })),
    onError: (error, _vars, context) => {
      if (context?.previous) queryClient.setQueryData(queryKeys.board, context.previous);
      toastRefusal(error, "Assigning the candidate");
    },
    onSuccess: (result, { card, person }) => {
      confirm(result);
      toast.success(person ? `${card.externalId} assigned to ${person.name}` : `${card.externalId} has no owner now`);
    },
    onSettled: settle,
  });

  return { move, assign };
}
