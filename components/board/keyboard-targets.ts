import { KeyboardCode, pointerWithin, rectIntersection, type CollisionDetection, type KeyboardCoordinateGetter, type UniqueIdentifier } from "@dnd-kit/core";

/**
 * Keyboard dragging jumps between drop targets instead of nudging pixels: right/down go to the next target in board
 * order (the columns, then the people on call), left/up to the previous one. The chosen target is remembered so the
 * collision check agrees with what the announcement said.
 */
export function createKeyboardTargets(initialOrder: UniqueIdentifier[] = []) {
  let target: UniqueIdentifier | null = null;
  let order = initialOrder;

  const coordinateGetter: KeyboardCoordinateGetter = (event, { context }) => {
    const forward = event.code === KeyboardCode.Right || event.code === KeyboardCode.Down;
    const backward = event.code === KeyboardCode.Left || event.code === KeyboardCode.Up;
    if (!forward && !backward) return undefined;
    event.preventDefault();
    const ids = order.filter((id) => context.droppableRects.has(id));
    if (ids.length === 0) return undefined;
    const current = target ?? context.over?.id ?? null;
    const index = current === null ? -1 : ids.indexOf(current);
    const next = ids[(index + (forward ? 1 : -1) + ids.length) % ids.length];
    const rect = next === undefined ? undefined : context.droppableRects.get(next);
    const dragged = context.collisionRect;
    if (next === undefined || !rect || !dragged) return undefined;
    target = next;
    // Float the card over the target's top centre (columns are tall; a person chip is small).
    return {
      x: rect.left + rect.width / 2 - dragged.width / 2,
      y: rect.top + Math.min(rect.height / 2, 48) - Math.min(dragged.height / 2, 24),
    };
  };

  /** Pointer drags use what is under the pointer; keyboard drags use the target chosen above. */
  const collisionDetection: CollisionDetection = (args) => {
    if (args.pointerCoordinates) return pointerWithin(args);
    return target !== null && args.droppableRects.has(target) ? [{ id: target }] : rectIntersection(args);
  };

  return {
    /** the drop targets in keyboard order; set again when they change (e.g. the roster) */
    setOrder(next: UniqueIdentifier[]) {
      order = next;
    },
    coordinateGetter,
    collisionDetection,
    begin(start: UniqueIdentifier | null) {
      target = start;
    },
    end() {
      target = null;
    },
  };
}
