// Who hears what: quiet hours versus being on call, nobody on call, task messages by site, cancelled tasks.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { appendEvent } from "@/lib/data/events";
import { followUpTasks, notificationPreferences, shifts, siteObservers, sites } from "@/db/schema";
import { defaultPreferences } from "@/lib/notify/preferences";
import { onTasksCancelled, onTasksCreated } from "@/lib/notify/hooks";
import { createTestUser } from "../helpers/test-db";
import { startHarness, type Harness } from "./support/harness";

let h: Harness;
const minute = 60_000;

beforeAll(async () => {
  // 23:00 UTC: inside everyone's quiet hours below.
  h = await startHarness({ startMs: Date.UTC(2031, 2, 4, 23, 0, 0) });
  await h.setPolicy({ steps: [{ target: "primary", afterMinutes: 0 }, { target: "backup", afterMinutes: 1 }], rules: [] });
  const db = await getDb();
  const quiet = { ...defaultPreferences(), quietStart: "22:00", quietEnd: "07:00" };
  for (const person of [h.people.primary, h.people.backup]) {
    await db.insert(notificationPreferences).values({ userId: person.id, preferences: quiet, updatedAt: new Date(h.clock.now()) });
  }
});
afterAll(() => h.stop());
beforeEach(() => h.smtp.clear());

describe("quiet hours", () => {
  it("do not hold back pages to the on-call primary, but do hold back the backup's (who still sees it in the app)", async () => {
    const candidate = await h.postCandidate();
    const worker = h.worker();
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.primary.email })).toHaveLength(1);
    h.clock.advance(minute + 1_000);
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.backup.email })).toHaveLength(0);
    const backupRows = await h.rows({ userId: h.people.backup.id, candidateId: candidate.id });
    expect(Object.fromEntries(backupRows.map((r) => [r.channel, r.status]))).toEqual({ "in-app": "sent", email: "skipped", push: "skipped" });
    expect(backupRows.find((r) => r.channel === "email")?.lastError).toMatch(/quiet hours/);
  });
});

describe("nobody on call", () => {
  it("pages the coordinators at once", async () => {
    const db = await getDb();
    await db.update(shifts).set({ endsAt: new Date(h.clock.now() - 1) }).where(eq(shifts.id, h.shiftId));
    const candidate = await h.postCandidate();
    await h.worker().runOnce();
    // (The ended shift also gets its handoff e-mail from the review area; only the page is counted here.)
    const pages = h.smtp.messages({ to: h.people.coordinator.email }).filter((m) => m.subject.includes(candidate.externalId));
    expect(pages).toHaveLength(1);
    expect(await h.rows({ userId: h.people.primary.id, candidateId: candidate.id })).toHaveLength(0);
    await db.update(shifts).set({ endsAt: new Date(h.clock.now() + 8 * 3_600_000) }).where(eq(shifts.id, h.shiftId));
  });
});

describe("follow-up tasks", () => {
  it("reach observers of the task's site, or the sites they chose instead, by the channels they chose", async () => {
    const db = await getDb();
    const candidate = await h.postCandidate();
    const [north, south] = await db
      .insert(sites)
      .values([
        { code: "NOR", name: "North Knoll", latitudeDeg: 40, longitudeDeg: 10, elevationM: 900, fieldOfViewDeg2: 3 },
        { code: "SOU", name: "South Mesa", latitudeDeg: -30, longitudeDeg: -70, elevationM: 2000, fieldOfViewDeg2: 1 },
      ])
      .returning();
    const byDefault = await createTestUser("observer", { name: "Oda Default" });
    const chooser = await createTestUser("observer", { name: "Ole Chooser" });
    await db.insert(siteObservers).values([{ siteId: north?.id ?? "", userId: byDefault.id }, { siteId: north?.id ?? "", userId: chooser.id }]);
    // Ole listens to the south site only, and only by e-mail.
    await db.insert(notificationPreferences).values({
      userId: chooser.id,
      preferences: { ...defaultPreferences(), taskSiteIds: [south?.id ?? ""], taskChannels: { push: false, email: true } },
      updatedAt: new Date(h.clock.now()),
    });
    const now = new Date(h.clock.now());
    const [task] = await db
      .insert(followUpTasks)
      .values({ candidateId: candidate.id, kind: "galaxy-targeted", siteId: north?.id ?? null, updatedAt: now })
      .returning();
    await db.transaction(async (tx) => {
      const event = await appendEvent(tx, { kind: "task.created", candidateId: candidate.id, taskId: task?.id });
      await onTasksCreated(tx, { candidateId: candidate.id, eventId: event.id, taskIds: [task?.id ?? ""] });
    });
    expect((await h.rows({ userId: byDefault.id, candidateId: candidate.id })).map((r) => r.channel).sort()).toEqual(["email", "in-app", "push"]);
    expect(await h.rows({ userId: chooser.id, candidateId: candidate.id })).toHaveLength(0);

    const [southTask] = await db
      .insert(followUpTasks)
      .values({
        candidateId: candidate.id,
        kind: "spectroscopy",
        siteId: south?.id ?? null,
        priority: 1,
        notes: "slit on the brightest host",
        windowStart: new Date(Date.UTC(2030, 0, 5, 21, 0)),
        windowEnd: new Date(Date.UTC(2030, 0, 5, 23, 30)),
        updatedAt: now,
      })
      .returning();
    await db.transaction(async (tx) => {
      const event = await appendEvent(tx, { kind: "task.created", candidateId: candidate.id, taskId: southTask?.id });
      await onTasksCreated(tx, { candidateId: candidate.id, eventId: event.id, taskIds: [southTask?.id ?? ""] });
    });
    const chosen = await h.rows({ userId: chooser.id, candidateId: candidate.id });
    expect(chosen.map((r) => r.channel).sort()).toEqual(["email", "in-app"]);
    // the kind's label, priority, window (UTC, with its year when not this year) and notes; not the kind's slug
    const body = chosen.find((r) => r.channel === "in-app")?.body ?? "";
    expect(body).toContain("Spectroscopy at SOU · P1 urgent · window 2030-01-05\u00a021:00 → 23:30\u00a0UTC · notes: slit on the brightest host");
    expect(body).not.toContain("spectroscopy at");
    // the claim link opens the follow-up board on this candidate's tasks
    expect(chosen.find((r) => r.channel === "email")?.url).toMatch(new RegExp(`/follow-up\\?candidate=${candidate.externalId}$`));

    await db.transaction(async (tx) => {
      const event = await appendEvent(tx, { kind: "candidate.withdrawn", candidateId: candidate.id });
      await onTasksCancelled(tx, { candidateId: candidate.id, eventId: event.id, ownerIds: [chooser.id], taskIds: [southTask?.id ?? ""], reason: "the feed withdrew the candidate" });
    });
    const cancelled = (await h.rows({ userId: chooser.id, candidateId: candidate.id })).filter((r) => r.kind === "task-cancelled");
    expect(cancelled.map((r) => r.channel).sort()).toEqual(["email", "in-app"]);
    expect(cancelled[0]?.title).toContain("cancelled");
  });

  it("reach every active observer for a task any site may take", async () => {
    const db = await getDb();
    const candidate = await h.postCandidate();
    const a = await createTestUser("observer", { name: "Ada Anywhere" });
    const b = await createTestUser("observer", { name: "Bo Anywhere" });
    const shifter = await createTestUser("shifter", { name: "Cy Notanobserver" });
    const [task] = await db.insert(followUpTasks).values({ candidateId: candidate.id, kind: "wide-field-tiling", siteId: null, updatedAt: new Date(h.clock.now()) }).returning();
    await db.transaction(async (tx) => {
      const event = await appendEvent(tx, { kind: "task.created", candidateId: candidate.id, taskId: task?.id });
      await onTasksCreated(tx, { candidateId: candidate.id, eventId: event.id, taskIds: [task?.id ?? ""] });
    });
    for (const observer of [a, b]) {
      const rows = await h.rows({ userId: observer.id, candidateId: candidate.id });
      expect(rows.find((r) => r.channel === "in-app")?.body).toContain("Wide-field tiling at any site · P2 normal · no window: as soon as possible");
    }
    expect(await h.rows({ userId: shifter.id, candidateId: candidate.id })).toHaveLength(0);
  });
});
