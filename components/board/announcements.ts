import type { Announcements, ScreenReaderInstructions, UniqueIdentifier } from "@dnd-kit/core";

export const screenReaderInstructions: ScreenReaderInstructions = {
  draggable:
    "To pick up a candidate, press space or enter on its move handle. Use the arrow keys to go from column to column and then to the people on call. Press space or enter to drop it there, or escape to cancel. Each card's actions button offers the same moves.",
};

/** Spoken descriptions of a drag, in the board's own words. */
export function boardAnnouncements(describe: {
  card: (id: UniqueIdentifier) => string;
  home: (id: UniqueIdentifier) => string;
  target: (cardId: UniqueIdentifier, targetId: UniqueIdentifier) => string;
}): Announcements {
  return {
    onDragStart: ({ active }) => `Picked up ${describe.card(active.id)}, now in ${describe.home(active.id)}.`,
    onDragOver: ({ active, over }) =>
      over ? `${describe.card(active.id)} is over ${describe.target(active.id, over.id)}.` : `${describe.card(active.id)} is not over a drop target.`,
    onDragEnd: ({ active, over }) =>
      over ? `${describe.card(active.id)} was dropped on ${describe.target(active.id, over.id)}.` : `${describe.card(active.id)} was put back.`,
    onDragCancel: ({ active }) => `Moving ${describe.card(active.id)} was cancelled; it stays in ${describe.home(active.id)}.`,
  };
}
