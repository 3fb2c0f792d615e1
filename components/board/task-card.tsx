"use client";

import { useDraggable } from "@dnd-kit/core";
import { Flag, GripVertical, MapPin } from "lucide-react";
import Link from "next/link";
import { memo } from "react";
import { Avatar } from "@/components/ui/avatar";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { cn } from "@/components/ui/cn";
import type { TaskState } from "@/db/schema/tasks";
import type { TaskCard } from "@/lib/data/tasks";
import { formatWindow, isoUtc, yearInZone } from "@/lib/format/time";
import { priorityLabels, taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";

export interface TaskAction {
  to: TaskState;
  label: string;
}

interface Props {
  task: TaskCard;
  timeZone: string;
  actions: TaskAction[];
  onAction?: (task: TaskCard, to: TaskState) => void;
}


export const TaskCardBody = memo(function TaskCardBody({ task, timeZone, actions, onAction }: Props) {
  // The year only decides whether dates carry theirs; a render at New Year's midnight is the one imprecision.
  const window = formatWindow(task.windowStart, task.windowEnd, timeZone, yearInZone(new Date(), timeZone));
  return (
    <div className="min-w-0 flex-1 space-y-1.5 text-xs">
      <div className="flex items-center gap-1.5">
        <span className="truncate text-sm font-semibold">{taskKindLabels[task.kind]}</span>
        <Badge tone={task.priority === 1 ? "alarm" : task.priority === 2 ? "neutral" : "neutral"} className="ml-auto shrink-0">
          <Flag aria-hidden className="h-3 w-3" />
          {priorityLabels[task.priority]?.split(" ")[0] ?? `P${task.priority}`}
          <span className="sr-only">{priorityLabels[task.priority]}</span>
        </Badge>
      </div>
      <div className="flex flex-wrap items-center gap-1.5">
        <Link href={`/candidates/${task.candidate.id}`} prefetch={false} className={cn("font-mono hover:underline", task.candidate.withdrawn && "line-through decoration-alarm")}>
          {task.candidate.externalId}
        </Link>
        {task.candidate.withdrawn ? <Badge tone="alarm">Withdrawn</Badge> : null}
      </div>
      <p className="flex items-center gap-1 text-muted">
        <MapPin aria-hidden className="h-3.5 w-3.5" />
        {task.site ? `${task.site.code} · ${task.site.name}` : "Any site"}
      </p>
      {window ? (
        <p className="text-muted" title={`${task.windowStart ? isoUtc(task.windowStart) : "now"} → ${task.windowEnd ? isoUtc(task.windowEnd) : "open end"}`}>
          Window {window}
        </p>
      ) : null}
      <p className="flex flex-wrap items-center gap-1 text-muted" data-testid="task-plan-summary">
        <Link href={`/follow-up/${task.id}`} prefetch={false} className="text-accent hover:underline">
          {task.plan
            ? `${task.plan.pointings} pointings · ${Math.round(task.plan.scheduledProbability * 100)} % scheduled${task.plan.done ? ` · ${task.plan.done} done` : ""}`
            : task.site
              ? "Open · plan pointings"
              : "Open task"}
        </Link>
      </p>
      {task.notes ? <p className="line-clamp-2 text-muted">{task.notes}</p> : null}
      {task.result ? <p className="rounded bg-ok/10 px-1.5 py-1 text-fg">Result: {task.result}</p> : null}
      <div className="flex flex-wrap items-center gap-1.5">
        {task.claimedBy ? (
          <span className="flex items-center gap-1 text-muted">
            <Avatar name={task.claimedBy.name} initials={task.claimedBy.initials} className="h-5 w-5" />
            {task.claimedBy.name}
          </span>
        ) : null}
        {onAction
          ? actions.map((a) => (
              <Button key={a.to} size="sm" variant={a.to === "cancelled" ? "ghost" : "secondary"} className="h-7 px-2 text-xs" onClick={() => onAction(task, a.to)}>
                {a.label}
              </Button>
            ))
          : null}
      </div>
    </div>
  );
});

export function DraggableTaskCard(props: Props) {
  const canDrag = props.actions.length > 0;
  const { setNodeRef, setActivatorNodeRef, listeners, attributes, isDragging } = useDraggable({ id: props.task.id, disabled: !canDrag });
  return (
    <article
      ref={setNodeRef}
      {...(canDrag ? listeners : {})}
      data-task-id={props.task.id}
      data-testid="task-card"
      aria-label={`${taskKindLabels[props.task.kind]} task for ${props.task.candidate.externalId}, ${taskStateLabels[props.task.state]}`}
      className={cn("flex gap-1 rounded-md border border-line bg-surface p-2 [contain-intrinsic-size:auto_8rem] [content-visibility:auto]", isDragging && "opacity-40", canDrag && "touch-none")}
    >
      {canDrag ? (
        <button
          type="button"
          ref={setActivatorNodeRef}
          {...attributes}
          aria-label={`Move ${taskKindLabels[props.task.kind]} task for ${props.task.candidate.externalId}`}
          className="-ml-1 flex w-4 shrink-0 cursor-grab items-start justify-center pt-0.5 text-faint hover:text-fg"
          data-focus-handle
        >
          <GripVertical aria-hidden className="h-4 w-4" />
        </button>
      ) : null}
      <TaskCardBody {...props} />
    </article>
  );
}
