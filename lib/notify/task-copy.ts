import type { FollowUpTask } from "@/db/schema";
import { formatWindow } from "@/lib/format/time";
import { priorityLabels, taskKindLabels } from "@/lib/triage/task-states";

export interface TaskForCopy {
  kind: FollowUpTask["kind"];
  siteCode: string | null;
  priority: number;
  notes: string;
  windowStart: Date | null;
  windowEnd: Date | null;
}

/**
 * One task in a message, in words: "Spectroscopy at ALD · P1 urgent · window 12-04 21:00 → 23:30 UTC · notes: slit on
 * the brightest host". Windows in UTC (the message reaches people in several zones; the board shows each their own).
 */
export function taskLine(task: TaskForCopy, now: Date): string {
  const parts = [
    `${taskKindLabels[task.kind] ?? task.kind} at ${task.siteCode ?? "any site"}`,
    priorityLabels[task.priority] ?? `P${task.priority}`,
  ];
  const window = formatWindow(task.windowStart, task.windowEnd, "UTC", now.getUTCFullYear());
  parts.push(window ? `window ${window}` : "no window: as soon as possible");
  const notes = task.notes.trim();
  if (notes) parts.push(`notes: ${notes.length > 200 ? `${notes.slice(0, 199)}…` : notes}`);
  return parts.join(" · ");
}
