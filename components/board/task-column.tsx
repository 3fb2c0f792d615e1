"use client";

import { useDroppable } from "@dnd-kit/core";
import { cn } from "@/components/ui/cn";
import type { TaskState } from "@/db/schema/tasks";
import { taskStateHints, taskStateLabels } from "@/lib/triage/task-states";

export function TaskColumn({ state, count, dropState, children }: { state: TaskState; count: number; dropState: "idle" | "allowed" | "refused" | "home"; children: React.ReactNode }) {
  const { setNodeRef, isOver } = useDroppable({ id: `column:${state}` });
  return (
    <section
      ref={setNodeRef}
      aria-labelledby={`task-column-${state}`}
      data-column={state}
      className={cn(
        "flex min-h-0 min-w-0 snap-start flex-col rounded-lg border bg-sunken",
        isOver && dropState === "allowed" ? "border-accent bg-accent/10" : "border-line",
        dropState === "refused" && "opacity-60",
      )}
    >
      <header className="border-b border-line px-2.5 py-2">
        <h2 id={`task-column-${state}`} className="flex items-center justify-between text-sm font-semibold">
          {taskStateLabels[state]}
          <span className="rounded bg-raised px-1.5 text-xs text-muted tabular-nums">{count}</span>
        </h2>
        <p className="text-xs text-faint">{dropState === "refused" ? "Not allowed for you from there" : taskStateHints[state]}</p>
      </header>
      <div className="min-h-24 flex-1 space-y-2 overflow-y-auto p-2">{children}</div>
    </section>
  );
}
