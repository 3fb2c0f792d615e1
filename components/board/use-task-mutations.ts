"use client";

import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import type { TaskState } from "@/db/schema/tasks";
import { apiFetch } from "@/lib/api-client";
import type { TaskCard } from "@/lib/data/tasks";
import { taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";
import { toastRefusal } from "./mutation-errors";
import { confirmCard, pendingMoveIds } from "./order-safe";

/** Every task move carries this key; the board's refetches keep the cards these moves are about. */
export const taskMoveKey = ["task-move"] as const;

/** Tasks with a move on its way to the server. */
export function pendingTaskIds(queryClient: QueryClient): Set<string> {
  return pendingMoveIds(queryClient.getMutationCache().findAll({ mutationKey: taskMoveKey }));
}

/** The task's version as the cache has it now (a move queued behind another one sends the version that one left). */
function currentVersion(queryClient: QueryClient, task: TaskCard): number {
  let version = task.version;
  for (const [, tasks] of queryClient.getQueriesData<TaskCard[]>({ queryKey: queryKeys.tasks })) {
    const cached = tasks?.find((t) => t.id === task.id);
    if (cached && cached.version > version) version = cached.version;
  }
  return version;
}

interface TaskAnswer {
  id: string;
  version: number;
  state: TaskState;
}

export type TaskMove =
  | { kind: "claim" }
  | { kind: "state"; to: "open" | "observing" | "cancelled"; reason?: string }
  | { kind: "report"; result: string };

const targetState = (move: TaskMove): TaskState => (move.kind === "claim" ? "claimed" : move.kind === "report" ? "reported" : move.to);

/** Claims, releases, starts, reports and cancels with an optimistic card move, rolled back with a message on refusal. */
export function useTaskMutation(viewer: { id: string; name: string; initials: string }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: taskMoveKey,
    // One move at a time, in the order they were made: a second move waits for the first one's answer (and its version).
    scope: { id: "task-moves" },
    mutationFn: async ({ task, move }: { task: TaskCard; move: TaskMove }): Promise<TaskAnswer | null> => {
      let answer: { task?: TaskAnswer };
      if (move.kind === "claim") answer = await apiFetch(`/api/v1/tasks/${task.id}/claim`, { method: "POST" });
      else if (move.kind === "report") answer = await apiFetch(`/api/v1/tasks/${task.id}/report`, { method: "POST", json: { result: move.result } });
      else {
        answer = await apiFetch(`/api/v1/tasks/${task.id}/state`, {
          method: "POST",
          json: { to: move.to, reason: move.reason, expectedVersion: currentVersion(queryClient, task) },
        });
      }
      const row = answer.task;
      return row && typeof row.version === "number" ? row : null;
    },
    onMutate: async ({ task, move }) => {
      await queryClient.cancelQueries({ queryKey: queryKeys.tasks });
      const snapshots = queryClient.getQueriesData<TaskCard[]>({ queryKey: queryKeys.tasks });
      const state = targetState(move);
      const claimedBy = move.kind === "claim" ? viewer : state === "open" ? null : task.claimedBy;
      queryClient.setQueriesData<TaskCard[]>({ queryKey: queryKeys.tasks }, (tasks) =>
        tasks?.map((t) => (t.id === task.id ? { ...t, state, claimedBy } : t)),
      );
      return { snapshots };
    },
    onError: (error, _vars, context) => {
      for (const [key, data] of context?.snapshots ?? []) queryClient.setQueryData(key, data);
      toastRefusal(error, "Changing the task");
    },
    onSuccess: (row, { task, move }) => {
      if (row) queryClient.setQueriesData<TaskCard[]>({ queryKey: queryKeys.tasks }, (tasks) => tasks && confirmCard(tasks, row, { state: row.state }));
      toast.success(`${taskKindLabels[task.kind]} for ${task.candidate.externalId}: ${taskStateLabels[targetState(move)]}`);
    },
    // Not awaited: the move counts as answered now, so the refetch's cards are taken (when not older).
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: queryKeys.tasks });
    },
  });
}
