"use client";

import { DndContext, DragOverlay, KeyboardSensor, PointerSensor, useSensor, useSensors, type DragEndEvent, type UniqueIdentifier } from "@dnd-kit/core";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import dynamic from "next/dynamic";
import { usePathname, useRouter } from "next/navigation";
import { useMemo, useRef, useState } from "react";
import { queryKeys } from "@/components/live/query-keys";
import type { TaskState } from "@/db/schema/tasks";
import { taskStates } from "@/db/schema/task-values";
import { apiFetch } from "@/lib/api-client";
import type { Role } from "@/lib/auth/roles";
import type { TaskCard } from "@/lib/data/tasks";
import { taskKindLabels, taskStateLabels } from "@/lib/triage/task-states";
import { BoardGrid } from "./board-grid";
import { boardAnnouncements } from "./announcements";
import { createKeyboardTargets } from "./keyboard-targets";
import { ProgressiveCards } from "./progressive-cards";
import type { SiteOption } from "./plan-follow-up-dialog";
import { DraggableTaskCard, TaskCardBody } from "./task-card";
import { TaskColumn } from "./task-column";
import { TaskFilters, type TaskFilterValues } from "./task-filters";
import { useFocusAfterMove } from "./use-focus-after-move";
import { taskActionsFor } from "./task-moves";
import { keepNewerCards } from "./order-safe";
import { pendingTaskIds, useTaskMutation } from "./use-task-mutations";

const TaskTextDialog = dynamic(() => import("./task-dialogs"), { ssr: false });

interface Viewer {
  id: string;
  name: string;
  initials: string;
  role: Role;
  timeZone: string;
}

function toQuery(filters: TaskFilterValues): string {
  const params = new URLSearchParams();
  if (filters.site) params.set("site", filters.site);
  if (filters.kind) params.set("kind", filters.kind);
  if (filters.candidate) params.set("candidate", filters.candidate);
  if (filters.mine) params.set("mine", "1");
  return params.toString();
}

export function FollowUpBoard({ initialTasks, initialFilters, sites, viewer }: { initialTasks: TaskCard[]; initialFilters: TaskFilterValues; sites: SiteOption[]; viewer: Viewer }) {
  const router = useRouter();
  const pathname = usePathname();
  const [filters, setFilters] = useState(initialFilters);
  const query = toQuery(filters);
  const [initialQuery] = useState(() => toQuery(initialFilters));
  const queryClient = useQueryClient();
  const { data: tasks = [] } = useQuery({
    queryKey: [...queryKeys.tasks, query],
    // Order-safe: a refetch never puts back an older card, nor one whose move is still on its way.
    queryFn: async () =>
      keepNewerCards(await apiFetch<TaskCard[]>(`/api/v1/tasks?${query}`), queryClient.getQueryData<TaskCard[]>([...queryKeys.tasks, query]), pendingTaskIds(queryClient)),
    initialData: query === initialQuery ? initialTasks : undefined,
    placeholderData: (previous) => previous,
  });
  const mutation = useTaskMutation(viewer);
  const [activeId, setActiveId] = useState<string | null>(null);
  const [textFor, setTextFor] = useState<{ task: TaskCard; mode: "report" | "cancel" } | null>(null);
  const focusTask = useFocusAfterMove("data-task-id");
  /** whether the drag in progress was started from the keyboard (its drop keeps focus on the card) */
  const keyboardDrag = useRef(false);

  const applyFilters = (next: TaskFilterValues) => {
    setFilters(next);
    const q = toQuery(next);
    router.replace(q ? `${pathname}?${q}` : pathname, { scroll: false });
  };

  const byId = useMemo(() => new Map(tasks.map((t) => [t.id, t])), [tasks]);
  const columns = useMemo(() => {
    const grouped = Object.fromEntries(taskStates.map((s) => [s, [] as TaskCard[]])) as Record<TaskState, TaskCard[]>;
    for (const task of tasks) grouped[task.state].push(task);
    return grouped;
  }, [tasks]);

  /** A move from a card's button or a keyboard drop keeps focus on the card in its new column; a mouse drop does not. */
  const act = (task: TaskCard, to: TaskState, keepFocus = true) => {
    if (keepFocus && to !== "reported" && to !== "cancelled") focusTask(task.id, to);
    if (to === "claimed") mutation.mutate({ task, move: { kind: "claim" } });
    else if (to === "reported") setTextFor({ task, mode: "report" });
    else if (to === "cancelled") setTextFor({ task, mode: "cancel" });
    else if (to === "open" || to === "observing") mutation.mutate({ task, move: { kind: "state", to } });
  };

  const [keyboard] = useState(() => createKeyboardTargets(taskStates.map((s): UniqueIdentifier => `column:${s}`)));
  const sensors = useSensors(useSensor(PointerSensor, { activationConstraint: { distance: 5 } }), useSensor(KeyboardSensor, { coordinateGetter: keyboard.coordinateGetter }));
  const active = activeId ? byId.get(activeId) : undefined;
  const activeActions = active ? taskActionsFor(active, viewer) : [];
  const describe = (id: UniqueIdentifier) => {
    const t = byId.get(String(id));
    return t ? `${taskKindLabels[t.kind]} task for ${t.candidate.externalId}` : "task";
  };
  const announcements = boardAnnouncements({
    card: describe,
    home: (id) => `column ${taskStateLabels[byId.get(String(id))?.state ?? "open"]}`,
    target: (cardId, targetId) => {
      const to = String(targetId).split(":")[1] as TaskState;
      const t = byId.get(String(cardId));
      const ok = t ? taskActionsFor(t, viewer).some((a) => a.to === to) : false;
      return `column ${taskStateLabels[to]}${ok || t?.state === to ? "" : ", not allowed for you"}`;
    },
  });

  const onDragEnd = ({ active: a, over }: DragEndEvent) => {
    setActiveId(null);
    keyboard.end();
    const task = byId.get(String(a.id));
    const to = over ? (String(over.id).split(":")[1] as TaskState) : null;
    if (task && to && to !== task.state && taskActionsFor(task, viewer).some((x) => x.to === to)) act(task, to, keyboardDrag.current);
  };

  return (
    <div data-testid="follow-up-board">
      <TaskFilters value={filters} sites={sites} onChange={applyFilters} />
      <DndContext
        id="follow-up-board"
        sensors={sensors}
        collisionDetection={keyboard.collisionDetection}
        accessibility={{ announcements }}
        onDragStart={({ active: a, activatorEvent }) => {
          keyboardDrag.current = typeof KeyboardEvent !== "undefined" && activatorEvent instanceof KeyboardEvent;
          setActiveId(String(a.id));
          keyboard.begin(`column:${byId.get(String(a.id))?.state ?? "open"}`);
        }}
        onDragEnd={onDragEnd}
        onDragCancel={() => {
          setActiveId(null);
          keyboard.end();
        }}
      >
        <BoardGrid columns={5}>
          {taskStates.map((state) => (
            <TaskColumn
              key={state}
              state={state}
              count={columns[state].length}
              dropState={!active ? "idle" : active.state === state ? "home" : activeActions.some((a) => a.to === state) ? "allowed" : "refused"}
            >
              <ProgressiveCards
                items={columns[state]}
                render={(task) => <DraggableTaskCard key={task.id} task={task} timeZone={viewer.timeZone} actions={taskActionsFor(task, viewer)} onAction={act} />}
              />
              {columns[state].length === 0 ? <p className="px-1 py-4 text-center text-xs text-faint">{state === "open" ? "No open tasks. Tasks appear when a candidate goes for follow-up." : "Empty"}</p> : null}
            </TaskColumn>
          ))}
        </BoardGrid>
        <DragOverlay dropAnimation={null}>
          {active ? (
            <div className="w-56 rounded-md border border-accent bg-surface p-2 shadow-2xl">
              <TaskCardBody task={active} timeZone={viewer.timeZone} actions={[]} />
            </div>
          ) : null}
        </DragOverlay>
      </DndContext>
      {textFor ? (
        <TaskTextDialog
          mode={textFor.mode}
          title={`${textFor.mode === "report" ? "Report" : "Cancel"}: ${taskKindLabels[textFor.task.kind]} for ${textFor.task.candidate.externalId}`}
          onCancel={() => setTextFor(null)}
          onConfirm={(text) => {
            const { task, mode } = textFor;
            focusTask(task.id, mode === "report" ? "reported" : "cancelled");
            setTextFor(null);
            mutation.mutate({ task, move: mode === "report" ? { kind: "report", result: text } : { kind: "state", to: "cancelled", reason: text } });
          }}
        />
      ) : null}
    </div>
  );
}
