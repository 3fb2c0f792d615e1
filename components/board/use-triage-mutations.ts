"use client";

import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import type { Candidate, TriageState } from "@/db/schema/candidates";
import { apiFetch } from "@/lib/api-client";
import type { BoardCard, BoardData } from "@/lib/data/candidates";
import type { RosterPerson } from "@/lib/data/triage";
import { triageLabels, type TriageVia } from "@/lib/triage/transitions";
import { toastRefusal } from "./mutation-errors";
import { confirmCard, pendingMoveIds } from "./order-safe";

/** Every move and assignment of a board card carries this key; the board's refetches keep those cards. */
export const triageMoveKey = ["triage-move"] as const;

/** Candidates with a move or an assignment on its way to the server. */
export function pendingCardIds(queryClient: QueryClient): Set<string> {
  return pendingMoveIds(queryClient.getMutationCache().findAll({ mutationKey: triageMoveKey }));
}

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
      data && { ...data, cards: confirmCard(data.cards, result.candidate, { triageState: result.candidate.triageState }) },
    );
  // Not awaited: the move counts as answered now, so the refetch's cards are taken (when not older).
  const settle = () => {
    void queryClient.invalidateQueries({ queryKey: queryKeys.board });
  };
  /** The card's version as the cache has it now (a move queued behind another sends the version that one left). */
  const versionOf = (card: BoardCard) => {
    const cached = queryClient.getQueryData<BoardData>(queryKeys.board)?.cards.find((c) => c.id === card.id);
    return Math.max(card.version, cached?.version ?? 0);
  };
  // One write at a time, in the order made: the second waits for the first's answer (and its version).
  const serial = { mutationKey: triageMoveKey, scope: { id: "triage-moves" } };

  const move = useMutation({
    ...serial,
    mutationFn: ({ card, to, reason, via }: MoveVars) =>
      apiFetch<Result>(`/api/v1/candidates/${card.id}/triage`, {
        method: "POST",
        json: { to, reason, via, expectedVersion: versionOf(card) },
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
    ...serial,
    mutationFn: ({ card, person, via }: AssignVars) =>
      apiFetch<Result>(`/api/v1/candidates/${card.id}/assign`, {
        method: "POST",
        json: { ownerId: person?.id ?? null, via, expectedVersion: versionOf(card) },
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
