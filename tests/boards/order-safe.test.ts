import { QueryClient } from "@tanstack/react-query";
import { describe, expect, it } from "vitest";
import { confirmCard, keepNewerCards, pendingMoveIds } from "@/components/board/order-safe";

interface Card {
  id: string;
  version: number;
  column: string;
  note?: string;
}

const card = (id: string, version: number, column: string, note?: string): Card => ({ id, version, column, note });
const none = new Set<string>();

describe("order-safe board caches", () => {
  it("a refetch that left before a move cannot put the moved card back while the move is on its way", () => {
    // cache: the optimistic move claimed → observing, version unchanged until the server answers
    const cached = [card("a", 3, "observing"), card("b", 1, "open")];
    const stale = [card("a", 3, "claimed"), card("b", 1, "open", "edited")];
    const merged = keepNewerCards(stale, cached, new Set(["a"]));
    expect(merged.find((c) => c.id === "a")?.column).toBe("observing");
    // other cards take the fetched copy
    expect(merged.find((c) => c.id === "b")?.note).toBe("edited");
  });

  it("after the answer, an older card from a late refetch loses to the confirmed one; an equal or newer one wins", () => {
    const optimistic = [card("a", 3, "observing")];
    const confirmed = confirmCard(optimistic, { id: "a", version: 4 }, { column: "observing" });
    expect(confirmed).toEqual([card("a", 4, "observing")]);
    expect(keepNewerCards([card("a", 3, "claimed")], confirmed, none)).toEqual([card("a", 4, "observing")]);
    expect(keepNewerCards([card("a", 4, "observing", "server copy")], confirmed, none)).toEqual([card("a", 4, "observing", "server copy")]);
    expect(keepNewerCards([card("a", 5, "reported")], confirmed, none)).toEqual([card("a", 5, "reported")]);
  });

  it("an answer older than the cache does not overwrite it; unknown cards pass and vanished cards go", () => {
    const cached = [card("a", 6, "reported")];
    expect(confirmCard(cached, { id: "a", version: 4 }, { column: "observing" })).toEqual(cached);
    expect(keepNewerCards([card("z", 1, "open")], cached, none)).toEqual([card("z", 1, "open")]);
    expect(keepNewerCards([card("a", 6, "reported")], undefined, none)).toEqual([card("a", 6, "reported")]);
  });

  it("finds the cards of pending moves in a query client's mutation cache, and only of pending ones", async () => {
    const client = new QueryClient();
    const cache = client.getMutationCache();
    const never = cache.build(client, { mutationKey: ["task-move"], mutationFn: () => new Promise<never>(() => undefined) });
    void never.execute({ task: { id: "t1" } });
    const done = cache.build(client, { mutationKey: ["task-move"], mutationFn: () => Promise.resolve(null) });
    await done.execute({ task: { id: "t2" } });
    const other = cache.build(client, { mutationKey: ["triage-move"], mutationFn: () => new Promise<never>(() => undefined) });
    void other.execute({ card: { id: "c1" } });
    await Promise.resolve();
    expect([...pendingMoveIds(cache.findAll({ mutationKey: ["task-move"] }))]).toEqual(["t1"]);
    expect([...pendingMoveIds(cache.findAll({ mutationKey: ["triage-move"] }))]).toEqual(["c1"]);
    client.clear();
  });
});
