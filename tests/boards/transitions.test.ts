import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db";
import { candidates, events, triageStates, type Role, type TriageState } from "@/db/schema";
import { POST as assignRoute } from "@/app/api/v1/candidates/[id]/assign/route";
import { POST as triageRoute } from "@/app/api/v1/candidates/[id]/triage/route";
import { transitionCandidate } from "@/lib/services/move-card";
import type * as Hooks from "@/lib/notify/hooks";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { callRoute, createCaller, insertCandidate, type Caller } from "./helpers/api";

// Records acknowledgement hook calls; the paging area owns the real body.
const acknowledged = vi.hoisted(() => [] as Array<{ candidateId: string; userId: string; inTransaction: boolean }>);
vi.mock("@/lib/notify/hooks", async (importOriginal) => {
  const original = await importOriginal<typeof Hooks>();
  return {
    ...original,
    onCandidateAcknowledged: async (tx: unknown, info: { candidateId: string; userId: string }) => {
      acknowledged.push({ ...info, inTransaction: typeof (tx as { rollback?: unknown }).rollback === "function" });
    },
  };
});

let testDb: TestDatabase;
const callers = {} as Record<Role, Caller>;

beforeAll(async () => {
  testDb = await setupTestDatabase();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) callers[role] = await createCaller(role);
});
afterAll(() => testDb.cleanup());
beforeEach(() => {
  acknowledged.length = 0;
});

// The expected table, written out by hand from the brief (not imported from the implementation).
const allowed: Record<TriageState, TriageState[]> = {
  new: ["acknowledged", "reviewing", "pursue", "dismissed", "expert"],
  acknowledged: ["reviewing", "pursue", "dismissed", "expert"],
  reviewing: ["pursue", "dismissed", "expert"],
  pursue: ["reviewing", "dismissed"],
  dismissed: ["reviewing"],
  expert: ["reviewing", "pursue", "dismissed"],
};

const triage = (caller: Caller, id: string, body: Record<string, unknown>) =>
  callRoute(triageRoute, { caller, params: { id }, body });

describe("every triage transition, per role", () => {
  for (const role of ["shifter", "coordinator", "observer", "admin"] as const) {
    for (const from of triageStates) {
      for (const to of triageStates) {
        const permitted = role === "shifter" || role === "coordinator";
        const expected = !permitted ? 403 : from === to ? 409 : allowed[from].includes(to) ? 200 : 422;
        it(`${role}: ${from} → ${to} answers ${expected}`, async () => {
          const id = await insertCandidate({ triageState: from });
          const res = await triage(callers[role], id, { to, reason: to === "dismissed" ? "instrument glitch" : undefined, via: "board" });
          expect(res.status, JSON.stringify(res.json)).toBe(expected);
          const db = await getDb();
          const [row] = await db.select().from(candidates).where(eq(candidates.id, id));
          const audit = await db.select().from(events).where(and(eq(events.candidateId, id), eq(events.kind, "candidate.triaged")));
          if (expected === 200) {
            expect(row?.triageState).toBe(to);
            expect(row?.version).toBe(2);
            expect(audit).toHaveLength(1);
            expect(audit[0]).toMatchObject({ fromState: from, toState: to, actorId: callers[role].user.id });
            expect(audit[0]?.data).toMatchObject({ via: "board" });
          } else {
            expect(row?.triageState).toBe(from);
            expect(row?.version).toBe(1);
            expect(audit).toHaveLength(0);
          }
        });
      }
    }
  }
});

describe("what a transition stamps", () => {
  it("acknowledging stamps who and when and calls the paging hook inside the transaction", async () => {
    const id = await insertCandidate();
    const at = new Date(Date.UTC(2030, 5, 1, 3, 0, 0));
    const { candidate, event } = await transitionCandidate({ actor: callers.shifter.user, candidateId: id, to: "acknowledged", via: "email", now: at });
    expect(candidate.acknowledgedAt?.getTime()).toBe(at.getTime());
    expect(candidate.acknowledgedById).toBe(callers.shifter.user.id);
    expect(candidate.decidedAt).toBeNull();
    expect(event.data).toMatchObject({ via: "email" });
    expect(acknowledged).toEqual([{ candidateId: id, userId: callers.shifter.user.id, at, inTransaction: true }]);
  });

  it("a decision straight from new acknowledges and decides at once", async () => {
    const id = await insertCandidate();
    const { candidate } = await transitionCandidate({ actor: callers.coordinator.user, candidateId: id, to: "expert", via: "menu" });
    expect(candidate.acknowledgedById).toBe(callers.coordinator.user.id);
    expect(candidate.decidedAt).not.toBeNull();
    expect(acknowledged).toHaveLength(1);
  });

  it("later moves do not acknowledge again", async () => {
    const id = await insertCandidate({ triageState: "acknowledged" });
    await transitionCandidate({ actor: callers.shifter.user, candidateId: id, to: "reviewing", via: "board" });
    expect(acknowledged).toHaveLength(0);
  });

  it("dismissing keeps the reason; reopening clears it", async () => {
    const id = await insertCandidate({ triageState: "reviewing" });
    const dismissed = await transitionCandidate({ actor: callers.shifter.user, candidateId: id, to: "dismissed", reason: "  scattered light  ", via: "board" });
    expect(dismissed.candidate.dismissReason).toBe("scattered light");
    expect(dismissed.event.data).toMatchObject({ reason: "scattered light" });
    const reopened = await transitionCandidate({ actor: callers.shifter.user, candidateId: id, to: "reviewing", via: "board" });
    expect(reopened.candidate.dismissReason).toBeNull();
  });
});

describe("refusals", () => {
  it("dismissing without a reason is 422, through the route and the domain function", async () => {
    const id = await insertCandidate({ triageState: "reviewing" });
    const res = await triage(callers.shifter, id, { to: "dismissed" });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.json.issues)).toContain("reason");
    await expect(transitionCandidate({ actor: callers.shifter.user, candidateId: id, to: "dismissed", reason: "   ", via: "api" })).rejects.toMatchObject({ status: 422 });
  });

  it("an unknown candidate is 404", async () => {
    expect((await triage(callers.shifter, "no-such-id", { to: "acknowledged" })).status).toBe(404);
  });

  it("a withdrawn candidate cannot go for follow-up, but can be dismissed", async () => {
    const id = await insertCandidate({ stage: "withdrawn", triageState: "reviewing" });
    expect((await triage(callers.shifter, id, { to: "pursue" })).status).toBe(422);
    expect((await triage(callers.shifter, id, { to: "dismissed", reason: "withdrawn by the feed" })).status).toBe(200);
  });

  it("a stale version is 409 with the current state and who changed it", async () => {
    const id = await insertCandidate();
    const first = await triage(callers.shifter, id, { to: "acknowledged", expectedVersion: 1 });
    expect(first.status).toBe(200);
    const stale = await triage(callers.coordinator, id, { to: "reviewing", expectedVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.json.current).toMatchObject({ triageState: "acknowledged", version: 2 });
    expect(stale.json.by).toEqual({ id: callers.shifter.user.id, name: callers.shifter.user.name });
  });

  it("two people dragging the same card at once: one wins, the other learns who", async () => {
    const other = await createCaller("shifter", "Second Shifter");
    for (let i = 0; i < 10; i++) {
      const id = await insertCandidate();
      const [a, b] = await Promise.all([
        triage(callers.shifter, id, { to: "reviewing", expectedVersion: 1 }),
        triage(other, id, { to: "dismissed", reason: "noise", expectedVersion: 1 }),
      ]);
      const statuses = [a.status, b.status].sort();
      expect(statuses).toEqual([200, 409]);
      const winner = a.status === 200 ? callers.shifter.user : other.user;
      const loser = a.status === 200 ? b : a;
      expect(loser.json.by).toEqual({ id: winner.id, name: winner.name });
      expect(loser.json.error).toContain(winner.name);
    }
  });
});

describe("assigning", () => {
  it("sets and clears the owner, refuses observers as owners and observers as callers", async () => {
    const id = await insertCandidate();
    const assign = (caller: Caller, ownerId: string | null) => callRoute(assignRoute, { caller, params: { id }, body: { ownerId } });
    expect((await assign(callers.observer, callers.shifter.user.id)).status).toBe(403);
    expect((await assign(callers.shifter, callers.observer.user.id)).status).toBe(422);
    expect((await assign(callers.shifter, "nobody")).status).toBe(404);
    const ok = await assign(callers.shifter, callers.coordinator.user.id);
    expect(ok.status).toBe(200);
    expect((ok.json.candidate as { ownerId: string }).ownerId).toBe(callers.coordinator.user.id);
    expect((await assign(callers.shifter, callers.coordinator.user.id)).status).toBe(409);
    const cleared = await assign(callers.coordinator, null);
    expect((cleared.json.candidate as { ownerId: string | null }).ownerId).toBeNull();
    const db = await getDb();
    const audit = await db.select().from(events).where(and(eq(events.candidateId, id), eq(events.kind, "candidate.assigned")));
    expect(audit.map((e) => e.data)).toEqual([
      expect.objectContaining({ ownerId: callers.coordinator.user.id, previousOwnerId: null }),
      expect.objectContaining({ ownerId: null, previousOwnerId: callers.coordinator.user.id }),
    ]);
  });
});
