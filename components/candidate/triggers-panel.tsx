"use client";

import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { toast } from "sonner";
import { toastRefusal } from "@/components/board/mutation-errors";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { apiFetch } from "@/lib/api-client";
import type { RegroupResult } from "@/lib/services/regroup-triggers";
import { TriggersTable, type TriggerRow } from "./triggers-table";

export interface MergeOption {
  id: string;
  externalId: string;
  source: string;
  triggerCount: number;
  /** event time minus this candidate's, seconds */
  offsetS: number;
}

/**
 * The triggers table, and for coordinators the two corrections to grouping: split a trigger out, merge a nearby
 * candidate in. Both are recorded in the audit log and undone by the other.
 */
export function TriggersPanel({
  candidateId,
  rows,
  timeZone,
  canRegroup,
  mergeOptions,
}: {
  candidateId: string;
  rows: TriggerRow[];
  timeZone: string;
  canRegroup: boolean;
  mergeOptions: MergeOption[];
}) {
  const router = useRouter();
  const [mergeId, setMergeId] = useState("");
  const split = useMutation({
    mutationFn: (triggerId: string) =>
      apiFetch<RegroupResult>(`/api/v1/candidates/${candidateId}/triggers/${triggerId}/split`, { method: "POST" }),
    onSuccess: (result) => {
      toast.success("Trigger split out", {
        description: result.returnedToMergedCandidate ? "Returned to the candidate it was merged from." : "It is a candidate of its own now.",
        action: { label: "Open", onClick: () => router.push(`/candidates/${result.toCandidateId}`) },
      });
      router.refresh();
    },
    onError: (error) => toastRefusal(error, "Splitting the trigger"),
  });
  const merge = useMutation({
    mutationFn: (otherId: string) => apiFetch<RegroupResult>(`/api/v1/candidates/${candidateId}/merge`, { method: "POST", json: { candidateId: otherId } }),
    onSuccess: (result) => {
      toast.success(`Merged: ${result.triggerIds.length} trigger${result.triggerIds.length === 1 ? "" : "s"} moved here`, {
        description: "Splitting one of them out again undoes the merge.",
      });
      setMergeId("");
      router.refresh();
    },
    onError: (error) => toastRefusal(error, "Merging"),
  });
  const busy = split.isPending || merge.isPending;
  return (
    <div className="space-y-3" data-testid="triggers-panel">
      <p className="text-xs text-muted">
        {rows.length === 1 ? "One pipeline reported this signal." : `${rows.length} pipelines reported this signal.`} The preferred
        trigger (lowest false-alarm rate, ties to the highest SNR) gives the candidate its numbers; the others show their
        difference from it.
      </p>
      <TriggersTable
        rows={rows}
        timeZone={timeZone}
        action={
          canRegroup && rows.length > 1
            ? (row) => (
                <Button size="sm" variant="ghost" disabled={busy} onClick={() => split.mutate(row.id)} aria-label={`Split ${row.source} ${row.externalId} out`}>
                  Split out
                </Button>
              )
            : undefined
        }
      />
      {canRegroup ? (
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (mergeId) merge.mutate(mergeId);
          }}
        >
          <label className="min-w-0 flex-1 space-y-1 text-sm">
            <span className="block font-medium">Merge a candidate into this one</span>
            <Select value={mergeId} onChange={(e) => setMergeId(e.target.value)} data-testid="merge-select">
              <option value="">{mergeOptions.length === 0 ? "No other candidate within 10 minutes" : "Choose a candidate…"}</option>
              {mergeOptions.map((o) => (
                <option key={o.id} value={o.id}>
                  {o.externalId} ({o.source}, {o.offsetS >= 0 ? "+" : "−"}
                  {Math.abs(o.offsetS).toFixed(1)}&nbsp;s, {o.triggerCount} trigger{o.triggerCount === 1 ? "" : "s"})
                </option>
              ))}
            </Select>
          </label>
          <Button type="submit" size="sm" disabled={busy || !mergeId}>
            Merge here
          </Button>
        </form>
      ) : null}
    </div>
  );
}

/** Shown instead of the panel on a candidate that was merged into another. */
export function MergedNotice({ intoId }: { intoId: string }) {
  return (
    <p role="status" className="rounded-md border border-line bg-raised px-3 py-2 text-sm">
      A coordinator merged this candidate into{" "}
      <Link className="underline" href={`/candidates/${intoId}`}>
        another candidate
      </Link>
      , which now holds its triggers. Its tasks and notes stay here.
    </p>
  );
}
