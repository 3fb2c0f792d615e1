"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import type { TaskState } from "@/db/schema/tasks";
import { apiFetch } from "@/lib/api-client";
import type { TaskCard } from "@/lib/data/tasks";
import { taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";
import { toastRefusal } from "./mutation-errors";

export type TaskMove =
  | { kind: "claim" }
  | { kind: "state"; to: "open" | "observing" | "cancelled"; reason?: string }
  | { kind: "report"; result: string };

const targetState = (move: TaskMove): TaskState => (move.kind === "claim" ? "claimed" : move.kind === "report" ? "reported" : move.to);

/** Claims, releases, starts, reports and cancels with an optimistic card move, rolled back with a message on refusal. */
export function useTaskMutation(viewer: { id: string; name: string; initials: string }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ task, move }: { task: TaskCard; move: TaskMove }) => {
      if (move.kind === "claim") return apiFetch(`/api/v1/tasks/${task.id}/claim`, { method: "POST" });
      if (move.kind === "report") return apiFetch(`/api/v1/tasks/${task.id}/report`, { method: "POST", json: { result: move.result } });
      return apiFetch(`/api/v1/tasks/${task.id}/state`, {
        method: "POST",
        json: { to: move.to, reason: move.reason, expectedVersion: task.version },
      });
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
    onSuccess: (_result, { task, move }) => {
      toast.success(`${taskKindLabels[task.kind]} for ${task.candidate.externalId}: ${taskStateLabels[targetState(move)]}`);
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.tasks }),
  });
}
