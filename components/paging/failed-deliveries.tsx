"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { CircleCheck, Mail, RotateCcw, Smartphone, TriangleAlert } from "lucide-react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiClientError } from "@/lib/api-client";
import { pagingKeys } from "./query-keys";
import type { FailedNotification } from "./types";
import { ZonedTime } from "./zoned-time";

/** Coordinators' view of messages the worker gave up on (and pages still failing); one click puts a message back in the outbox. */
export function FailedDeliveries({ timeZone }: { timeZone: string }) {
  const queryClient = useQueryClient();
  const failed = useQuery({
    queryKey: pagingKeys.failed,
    queryFn: () => apiFetch<{ items: FailedNotification[] }>("/api/v1/notifications/failed"),
    refetchInterval: 30_000,
  });
  const retry = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/notifications/${encodeURIComponent(id)}/retry`, { method: "POST" }),
    onSuccess: () => toast.success("Back in the outbox; the worker will try again now."),
    onError: (e) => toast.error(e instanceof ApiClientError ? e.message : "Could not retry"),
    onSettled: () => queryClient.invalidateQueries({ queryKey: pagingKeys.failed }),
  });
  const items = failed.data?.items ?? [];
  if (failed.isPending) return <p className="text-sm text-muted">Loading…</p>;
  if (items.length === 0) {
    return (
      <p className="flex items-center gap-2 text-sm text-muted">
        <CircleCheck aria-hidden className="h-4 w-4 text-ok" /> No failed deliveries.
      </p>
    );
  }
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm" data-testid="failed-deliveries">
        <thead className="text-left text-xs uppercase tracking-wide text-muted">
          <tr>
            <th className="py-2 pr-3">Message</th>
            <th className="py-2 pr-3">To</th>
            <th className="py-2 pr-3">Channel</th>
            <th className="py-2 pr-3">Why</th>
            <th className="py-2 pr-3">Queued</th>
            <th className="py-2" />
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {items.map((n) => (
            <tr key={n.id}>
              <td className="py-2 pr-3">
                <span className="flex items-center gap-1.5">
                  <TriangleAlert aria-hidden className="h-3.5 w-3.5 text-alarm" />
                  {n.title}
                </span>
              </td>
              <td className="py-2 pr-3">{n.recipient ? `${n.recipient.name}` : "—"}</td>
              <td className="py-2 pr-3">
                <span className="inline-flex items-center gap-1">
                  {n.channel === "push" ? <Smartphone aria-hidden className="h-3.5 w-3.5" /> : <Mail aria-hidden className="h-3.5 w-3.5" />}
                  {n.channel} · {n.attempts} tries
                </span>
                {n.stillRetrying ? (
                  <span className="block text-xs text-warn" data-testid="still-retrying">
                    still retrying; next step escalated
                  </span>
                ) : null}
              </td>
              <td className="max-w-sm py-2 pr-3 font-mono text-xs text-muted">{n.lastError ?? "—"}</td>
              <td className="py-2 pr-3 text-xs">
                <ZonedTime at={n.createdAt} timeZone={timeZone} />
              </td>
              <td className="py-2 text-right">
                <Button size="sm" variant="secondary" onClick={() => retry.mutate(n.id)} disabled={retry.isPending}>
                  <RotateCcw aria-hidden className="h-3.5 w-3.5" /> Retry
                </Button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
