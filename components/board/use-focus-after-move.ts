"use client";

import { useCallback, useEffect, useState } from "react";

interface Target {
  /** the card's id, as in its `data-card-id` / `data-task-id` attribute */
  id: string;
  /** the `data-column` the card is moving to */
  column: string;
}

/** How long after a move focus is kept on the card (a drop's own focus restore, a dialog closing, a refetch). */
const GUARD_MS = 2_000;
const POLL_MS = 50;

/** The element of a card that takes focus: its move handle, else its first button or link, else the card. */
function focusableIn(card: HTMLElement): HTMLElement {
  return card.querySelector<HTMLElement>("[data-focus-handle]") ?? card.querySelector<HTMLElement>("button, a[href]") ?? card;
}

/**
 * Keeps keyboard focus on a card that a keyboard drop, a card menu or a card button moved to another column. The
 * card is drawn anew in its new column (its old element, which had focus, is gone), so focus would fall to
 * `<body>`. Once the card shows up in the target column, and for a short while after, focus that falls to `<body>`
 * is put back on the card's handle; a click anywhere or focus moved on purpose ends the guard.
 */
export function useFocusAfterMove(attribute: "data-card-id" | "data-task-id"): (id: string, column: string) => void {
  const [target, setTarget] = useState<Target | null>(null);

  useEffect(() => {
    if (!target) return;
    let placed = false;
    const find = () => {
      const column = document.querySelector(`[data-column="${CSS.escape(target.column)}"]`);
      return column?.querySelector<HTMLElement>(`[${attribute}="${CSS.escape(target.id)}"]`) ?? null;
    };
    const tick = () => {
      const card = find();
      if (!card) return;
      const active = document.activeElement;
      if (active === null || active === document.body || !active.isConnected) {
        focusableIn(card).focus({ preventScroll: false });
        placed = true;
      } else if (placed && !card.contains(active) && !active.closest('[role="dialog"]')) {
        // Someone moved focus elsewhere on purpose: leave it there.
        setTarget(null);
      }
    };
    tick();
    const poll = window.setInterval(tick, POLL_MS);
    const stop = window.setTimeout(() => setTarget(null), GUARD_MS);
    const cancel = () => setTarget(null);
    document.addEventListener("pointerdown", cancel, true);
    return () => {
      window.clearInterval(poll);
      window.clearTimeout(stop);
      document.removeEventListener("pointerdown", cancel, true);
    };
  }, [attribute, target]);

  return useCallback((id: string, column: string) => setTarget({ id, column }), []);
}
