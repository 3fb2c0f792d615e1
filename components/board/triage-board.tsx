"use client";

import {
  DndContext,
  DragOverlay,
  KeyboardSensor,
  PointerSensor,
  useSensor,
  useSensors,
  type DragEndEvent,
  type DragStartEvent,
  type UniqueIdentifier,
} from "@dnd-kit/core";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useMemo, useRef, useState, useSyncExternalStore } from "react";
import { toast } from "sonner";
import { stageLabels } from "@/components/candidate/stage-badge";
import { useLiveEvents } from "@/components/live/live-store";
import { queryKeys } from "@/components/live/query-keys";
import type { Stage, TriageState } from "@/db/schema/candidates";
import { triageStates } from "@/db/schema/candidate-values";
import { apiFetch } from "@/lib/api-client";
import { can, hasRole, type Role } from "@/lib/auth/roles";
import type { BoardCard, BoardData } from "@/lib/data/candidates";
import type { Roster, RosterPerson } from "@/lib/data/triage";
import { formatFalseAlarmRate } from "@/lib/format/far";
import { canTransition, triageLabels, type TriageVia } from "@/lib/triage/transitions";
import type { TaskDraft } from "@/lib/validations/tasks";
import { BoardGrid } from "./board-grid";
import { boardAnnouncements, screenReaderInstructions } from "./announcements";
import { createKeyboardTargets } from "./keyboard-targets";
import { ProgressiveCards } from "./progressive-cards";
import { toastRefusal } from "./mutation-errors";
import { useFocusAfterMove } from "./use-focus-after-move";
import type { SiteOption } from "./plan-follow-up-dialog";
import { RosterStrip } from "./roster-strip";
import { DraggableTriageCard, TriageCardBody } from "./triage-card";
import { TriageColumn } from "./triage-column";
import { setServerNow } from "./use-now";
import { keepNewerCards } from "./order-safe";
import { pendingCardIds, useTriageMutations } from "./use-triage-mutations";

// Forms load on first use, keeping the board's first-load script small.
const DismissDialog = dynamic(() => import("./dismiss-dialog"), { ssr: false });
const PlanFollowUpDialog = dynamic(() => import("./plan-follow-up-dialog"), { ssr: false });
const CardActionsDialog = dynamic(() => import("./card-actions-dialog").then((m) => m.CardActionsDialog), { ssr: false });

const noSubscription = () => () => undefined;

/** false while rendering on the server and hydrating, true once the board is live in the browser. */
function useHydrated(): boolean {
  return useSyncExternalStore(noSubscription, () => true, () => false);
}

interface Viewer {
  id: string;
  role: Role;
  timeZone: string;
}

interface Pending {
  card: BoardCard;
  via: TriageVia;
  /** the move came from the keyboard or the card menu: focus follows the card to its new column */
  keepFocus: boolean;
}

export function TriageBoard({
  initialBoard,
  initialRoster,
  sites,
  viewer,
}: {
  initialBoard: BoardData;
  initialRoster: Roster;
  sites: SiteOption[];
  viewer: Viewer;
}) {
  const router = useRouter();
  const canTriage = hasRole(viewer, can.triage);
  const queryClient = useQueryClient();
  const { data: board } = useQuery({
    queryKey: queryKeys.board,
    // Order-safe: a refetch never puts back an older card, nor one whose move is still on its way.
    queryFn: async () => {
      const fresh = await apiFetch<BoardData>("/api/v1/board");
      const cached = queryClient.getQueryData<BoardData>(queryKeys.board);
      return { ...fresh, cards: keepNewerCards(fresh.cards, cached?.cards, pendingCardIds(queryClient)) };
    },
    initialData: initialBoard,
  });
  const { data: roster } = useQuery({ queryKey: queryKeys.roster, queryFn: () => apiFetch<Roster>("/api/v1/roster"), initialData: initialRoster });
  const { move, assign } = useTriageMutations();
  const [activeId, setActiveId] = useState<string | null>(null);
  const [actionsFor, setActionsFor] = useState<string | null>(null);
  const [dismissing, setDismissing] = useState<Pending | null>(null);
  const [planning, setPlanning] = useState<Pending | null>(null);
  const ready = useHydrated();
  const focusCard = useFocusAfterMove("data-card-id");
  /** whether the drag in progress was started from the keyboard (its drop keeps focus on the card) */
  const keyboardDrag = useRef(false);

  useEffect(() => setServerNow(board.serverNow), [board.serverNow]);

  const byId = useMemo(() => new Map(board.cards.map((c) => [c.id, c])), [board.cards]);
  const columns = useMemo(() => {
    const grouped = Object.fromEntries(triageStates.map((s) => [s, [] as BoardCard[]])) as Record<TriageState, BoardCard[]>;
    for (const card of board.cards) grouped[card.triageState].push(card);
    // New lists the newest arrival first; the other columns the latest change first, so a moved card is on top.
    for (const state of triageStates) {
      if (state !== "new") grouped[state].sort((a, b) => b.updatedAt - a.updatedAt || b.receivedAt - a.receivedAt);
    }
    return grouped;
  }, [board.cards]);
  const peopleById = useMemo(() => new Map(roster.people.map((p) => [p.id, p])), [roster.people]);

  // Drop-target order for keyboard dragging: columns left to right, then people.
  const [keyboard] = useState(() => createKeyboardTargets());
  useEffect(() => {
    keyboard.setOrder([...triageStates.map((s): UniqueIdentifier => `column:${s}`), ...roster.people.map((p) => `person:${p.id}`)]);
  }, [keyboard, roster.people]);
  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 5 } }),
    useSensor(KeyboardSensor, { coordinateGetter: keyboard.coordinateGetter }),
  );

  const requestMove = useCallback(
    (card: BoardCard, to: TriageState, via: TriageVia, keepFocus: boolean) => {
      if (to === card.triageState) return;
      if (!canTransition(card.triageState, to)) {
        toast.warning(`Cannot move from “${triageLabels[card.triageState]}” to “${triageLabels[to]}”`);
        return;
      }
      if (to === "dismissed") setDismissing({ card, via, keepFocus });
      else if (to === "pursue") setPlanning({ card, via, keepFocus });
      else {
        if (keepFocus) focusCard(card.id, to);
        move.mutate({ card, to, via });
      }
    },
    [move, focusCard],
  );
  const requestAssign = useCallback(
    (card: BoardCard, person: RosterPerson | null, via: TriageVia, keepFocus: boolean) => {
      if ((card.owner?.id ?? null) === (person?.id ?? null)) return;
      if (keepFocus) focusCard(card.id, card.triageState);
      assign.mutate({ card, person, via });
    },
    [assign, focusCard],
  );

  const onDragStart = ({ active, activatorEvent }: DragStartEvent) => {
    keyboardDrag.current = typeof KeyboardEvent !== "undefined" && activatorEvent instanceof KeyboardEvent;
    const card = byId.get(String(active.id));
    setActiveId(String(active.id));
    keyboard.begin(card ? `column:${card.triageState}` : null);
  };
  const onDragEnd = ({ active, over }: DragEndEvent) => {
    setActiveId(null);
    keyboard.end();
    const card = byId.get(String(active.id));
    if (!card || !over) return;
    const [kind, id] = String(over.id).split(":") as [string, string];
    if (kind === "column") requestMove(card, id as TriageState, "board", keyboardDrag.current);
    if (kind === "person") requestAssign(card, peopleById.get(id) ?? null, "board", keyboardDrag.current);
  };

  const announcements = useMemo(
    () =>
      boardAnnouncements({
        card: (id) => `candidate ${byId.get(String(id))?.externalId ?? ""}`,
        home: (id) => `column ${triageLabels[byId.get(String(id))?.triageState ?? "new"]}`,
        target: (cardId, targetId) => {
          const [kind, id] = String(targetId).split(":") as [string, string];
          if (kind === "person") return `${peopleById.get(id)?.name ?? "a person"}; drop to assign`;
          const from = byId.get(String(cardId))?.triageState ?? "new";
          const to = id as TriageState;
          const note = to === from ? ", where it is now" : canTransition(from, to) ? "" : ", not allowed from here";
          return `column ${triageLabels[to]}${note}`;
        },
      }),
    [byId, peopleById],
  );

  useLiveEvents((event) => {
    if (event.kind !== "candidate.created") return;
    const data = event.data ?? {};
    const name = typeof data.externalId === "string" ? data.externalId : "candidate";
    const stage = typeof data.stage === "string" ? stageLabels[data.stage as Stage] : undefined;
    const far = typeof data.falseAlarmRatePerYear === "number" ? `FAR ${formatFalseAlarmRate(data.falseAlarmRatePerYear)}` : undefined;
    toast.info(`New candidate ${name}`, {
      description: [stage, far].filter(Boolean).join(" · "),
      action: event.candidateId ? { label: "Open", onClick: () => router.push(`/candidates/${event.candidateId}`) } : undefined,
    });
  });

  const openActions = useCallback((id: string) => setActionsFor(id), []);
  // One tap on the card: New → Acknowledged, focus staying on the card in its new column.
  const acknowledge = useCallback(
    (id: string) => {
      const card = byId.get(id);
      if (card) requestMove(card, "acknowledged", "card", true);
    },
    [byId, requestMove],
  );
  const activeCard = activeId ? byId.get(activeId) : undefined;
  const actionsCard = actionsFor ? (byId.get(actionsFor) ?? null) : null;

  const submitPlan = async (pending: Pending, tasks: TaskDraft[]) => {
    if (pending.keepFocus) focusCard(pending.card.id, "pursue");
    try {
      await move.mutateAsync({ card: pending.card, to: "pursue", via: pending.via });
    } catch {
      setPlanning(null);
      return;
    }
    setPlanning(null);
    if (tasks.length === 0) return;
    try {
      await apiFetch(`/api/v1/candidates/${pending.card.id}/tasks`, { method: "POST", json: { tasks } });
      toast.success(`${tasks.length} follow-up task${tasks.length === 1 ? "" : "s"} created for ${pending.card.externalId}`);
    } catch (error) {
      toastRefusal(error, "Creating the follow-up tasks");
    }
  };

  return (
    <div data-testid="triage-board" data-board-ready={ready ? "true" : undefined}>
      <DndContext
        id="triage-board"
        sensors={sensors}
        collisionDetection={keyboard.collisionDetection}
        onDragStart={onDragStart}
        onDragEnd={onDragEnd}
        onDragCancel={() => {
          setActiveId(null);
          keyboard.end();
        }}
        accessibility={{ announcements, screenReaderInstructions }}
      >
        <RosterStrip roster={roster} dragging={activeCard !== undefined} />
        <BoardGrid columns={6}>
          {triageStates.map((state) => (
            <TriageColumn
              key={state}
              state={state}
              count={columns[state].length}
              dropState={
                !activeCard ? "idle" : activeCard.triageState === state ? "home" : canTransition(activeCard.triageState, state) ? "allowed" : "refused"
              }
            >
              <ProgressiveCards
                items={columns[state]}
                render={(card) => (
                  <DraggableTriageCard
                    key={card.id}
                    card={card}
                    canDrag={canTriage}
                    deadlines={board.deadlines}
                    timeZone={viewer.timeZone}
                    onActions={openActions}
                    onAcknowledge={canTriage ? acknowledge : undefined}
                  />
                )}
              />
              {columns[state].length === 0 ? (
                <p className="px-1 py-4 text-center text-xs text-faint">
                  {state === "new" ? "Nothing waiting. New triggers from the feed land here." : "Empty"}
                </p>
              ) : null}
            </TriageColumn>
          ))}
        </BoardGrid>
        <DragOverlay dropAnimation={null}>
          {activeCard ? (
            <div className="w-60 rounded-md border border-accent bg-surface p-2 shadow-2xl">
              <TriageCardBody card={activeCard} deadlines={board.deadlines} timeZone={viewer.timeZone} />
            </div>
          ) : null}
        </DragOverlay>
      </DndContext>
      {actionsCard ? (
        <CardActionsDialog
          card={actionsCard}
          roster={roster}
          canTriage={canTriage}
          onClose={() => setActionsFor(null)}
          onMove={(card, to) => {
            setActionsFor(null);
            requestMove(card, to, "menu", true);
          }}
          onAssign={(card, person) => {
            setActionsFor(null);
            requestAssign(card, person, "menu", true);
          }}
        />
      ) : null}
      {dismissing ? (
        <DismissDialog
          externalId={dismissing.card.externalId}
          onCancel={() => {
            if (dismissing.keepFocus) focusCard(dismissing.card.id, dismissing.card.triageState);
            setDismissing(null);
          }}
          onConfirm={(reason) => {
            if (dismissing.keepFocus) focusCard(dismissing.card.id, "dismissed");
            move.mutate({ card: dismissing.card, to: "dismissed", reason, via: dismissing.via });
            setDismissing(null);
          }}
        />
      ) : null}
      {planning ? (
        <PlanFollowUpDialog
          candidateId={planning.card.id}
          externalId={planning.card.externalId}
          sites={sites}
          onCancel={() => {
            if (planning.keepFocus) focusCard(planning.card.id, planning.card.triageState);
            setPlanning(null);
          }}
          onSubmit={(tasks) => submitPlan(planning, tasks)}
        />
      ) : null}
    </div>
  );
}
