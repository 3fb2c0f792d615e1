/**
 * Order-safe board caches. A board's list is refetched after every change (its own and, through the live stream,
 * everyone's), and those answers can arrive out of order: a refetch that left before a move reached the server
 * answers the card's old column after the optimistic update, and the card jumps back until the next reload.
 * Every card carries the row's `version` (raised by each write), so a fetched card replaces the cached one only
 * when it is not older, and never while a move of that card is still on its way (the server has not answered, so
 * no fetch can be trusted to include it).
 */
export interface Versioned {
  id: string;
  version: number;
}

/** The fetched list, with each card kept from the cache when the cache's copy is newer or a move of it is pending. */
export function keepNewerCards<T extends Versioned>(fetched: readonly T[], cached: readonly T[] | undefined, pendingIds: ReadonlySet<string>): T[] {
  if (!cached || cached.length === 0) return [...fetched];
  const byId = new Map(cached.map((card) => [card.id, card]));
  return fetched.map((card) => {
    const mine = byId.get(card.id);
    if (!mine) return card;
    return pendingIds.has(card.id) || mine.version > card.version ? mine : card;
  });
}

/** A card patched with what the server answered for it, unless the cache already holds a newer version. */
export function confirmCard<T extends Versioned>(cards: readonly T[], answer: Versioned, patch: Partial<T>): T[] {
  return cards.map((card) => (card.id === answer.id && answer.version >= card.version ? { ...card, ...patch, version: answer.version } : card));
}

/** The ids of the cards whose moves (mutations under `mutationKey`, variables `{ card }` or `{ task }`) await an answer. */
export function pendingMoveIds(mutations: ReadonlyArray<{ state: { status: string; variables: unknown } }>): Set<string> {
  const ids = new Set<string>();
  for (const m of mutations) {
    if (m.state.status !== "pending") continue;
    const vars = m.state.variables as { card?: { id?: unknown }; task?: { id?: unknown } } | undefined;
    const id = vars?.card?.id ?? vars?.task?.id;
    if (typeof id === "string") ids.add(id);
  }
  return ids;
}
