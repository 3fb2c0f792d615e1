"use client";

import { useQuery } from "@tanstack/react-query";
import { AlarmClock, Hourglass } from "lucide-react";
import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { Dialog } from "@/components/ui/dialog";
import { apiFetch, errorText } from "@/lib/api-client";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { formatDurationMs } from "@/lib/review/format";
import type { StepList } from "@/lib/review/list";
import { steps, type StepId } from "@/lib/review/steps";

export interface ListingSpec {
  step: StepId;
  bin?: string;
  late?: boolean;
  week?: string;
  title: string;
}

export function listingSearch(filterQuery: string, spec: ListingSpec): string {
  const params = new URLSearchParams(filterQuery);
  params.set("step", spec.step);
  if (spec.bin) params.set("bin", spec.bin);
  if (spec.late) params.set("late", "1");
  if (spec.week) params.set("week", spec.week);
  return params.toString();
}

/** The candidates behind a bar or a count, slowest first, each linking to its page. */
export function StepCandidatesDialog({
  spec,
  filterQuery,
  timeZone,
  onClose,
}: {
  spec: ListingSpec | null;
  filterQuery: string;
  timeZone: string;
  onClose: () => void;
}) {
  const search = spec ? listingSearch(filterQuery, spec) : "";
  const query = useQuery({
    queryKey: ["review-list", search],
    queryFn: () => apiFetch<StepList>(`/api/v1/review/candidates?${search}`),
    enabled: spec !== null,
  });
  const list = query.data;
  return (
    <Dialog
      open={spec !== null}
      onOpenChange={(open) => !open && onClose()}
      title={spec?.title ?? ""}
      description={spec ? `${steps[spec.step].label}: ${steps[spec.step].span}` : undefined}
    >
      {query.isLoading ? <p className="text-sm text-muted">Loading…</p> : null}
      {query.isError ? (
        <p role="alert" className="text-sm text-alarm">
          Could not load: {errorText(query.error)}
        </p>
      ) : null}
      {list ? (
        <>
          <p className="mb-2 text-xs text-muted" data-testid="list-total">
            {list.total} candidate{list.total === 1 ? "" : "s"}
            {list.total > list.rows.length ? `; the ${list.rows.length} slowest shown` : ""} · deadline {formatDurationMs(list.deadlineMs)}
          </p>
          <ul className="divide-y divide-line rounded-md border border-line" data-testid="step-candidates">
            {list.rows.map((r) => (
              <li key={r.id} className="flex items-center justify-between gap-3 px-3 py-2 text-sm">
                <div className="min-w-0">
                  <Link href={`/candidates/${r.id}`} className="font-mono text-accent hover:underline">
                    {r.externalId}
                  </Link>
                  <p className="text-xs text-muted">
                    received <time dateTime={r.receivedAt} title={isoUtc(r.receivedAt)}>{formatInZone(r.receivedAt, timeZone)}</time>
                    {r.actorName ? ` · ${r.actorName}` : ""}
                  </p>
                </div>
                <div className="flex shrink-0 items-center gap-2">
                  <span className="font-mono">{formatDurationMs(r.durationMs)}</span>
                  {r.status === "open" ? (
                    <Badge tone="warn">
                      <Hourglass aria-hidden className="h-3 w-3" /> open
                    </Badge>
                  ) : null}
                  {r.overDeadline ? (
                    <Badge tone="alarm">
                      <AlarmClock aria-hidden className="h-3 w-3" /> late
                    </Badge>
                  ) : null}
                </div>
              </li>
            ))}
            {list.rows.length === 0 ? <li className="px-3 py-4 text-sm text-muted">No candidates here.</li> : null}
          </ul>
        </>
      ) : null}
    </Dialog>
  );
}
