"use client";

import { useDroppable } from "@dnd-kit/core";
import { cn } from "@/components/ui/cn";
import type { TriageState } from "@/db/schema/candidates";
import { triageHints, triageLabels } from "@/lib/triage/transitions";

/** One column of the triage board and its drop zone; `dropState` says whether the card being dragged may land here. */
export function TriageColumn({
  state,
  count,
  dropState,
  children,
}: {
  state: TriageState;
  count: number;
  dropState: "idle" | "allowed" | "refused" | "home";
  children: React.ReactNode;
}) {
  const { setNodeRef, isOver } = useDroppable({ id: `column:${state}`, data: { kind: "column", state } });
  const headingId = `column-${state}-heading`;
  return (
    <section
      ref={setNodeRef}
      aria-labelledby={headingId}
      data-column={state}
      className={cn(
        "flex min-h-0 min-w-0 snap-start flex-col rounded-lg border bg-sunken transition-colors",
        isOver && dropState === "allowed" ? "border-accent bg-accent/10" : "border-line",
        isOver && dropState === "refused" && "border-alarm/60",
        dropState === "refused" && "opacity-60",
      )}
    >
      <header className="border-b border-line px-2.5 py-2">
        <h2 id={headingId} className="flex items-center justify-between text-sm font-semibold">
          {triageLabels[state]}
          <span className="rounded bg-raised px-1.5 text-xs font-medium text-muted tabular-nums" aria-label={`${count} candidates`}>
            {count}
          </span>
        </h2>
        <p className="text-xs text-faint">{dropState === "refused" ? "Not allowed from there" : triageHints[state]}</p>
      </header>
      <div className="min-h-24 flex-1 space-y-2 overflow-y-auto p-2">{children}</div>
    </section>
  );
}
