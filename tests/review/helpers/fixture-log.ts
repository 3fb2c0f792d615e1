import { getDb } from "@/db";
import { candidates, followUpTasks, notifications, shifts, sites, type NewCandidate } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { createTestUser } from "../../helpers/test-db";

/**
 * A small audit log written by hand, every time chosen so the expected durations can be worked out on paper
 * (see ../timeline.test.ts). T0 is a Monday, 10:00 UTC. Fictional source "tessera", ids TX-A … TX-F.
 */
export const T0 = Date.UTC(2026, 2, 2, 10, 0, 0);
export const s = (seconds: number) => T0 + seconds * 1000;
export const min = (minutes: number) => T0 + minutes * 60_000;
/** the review's "now" for the fixture */
export const NOW = min(300);

export interface FixtureLog {
  shifter: SessionUser;
  shifter2: SessionUser;
  observer: SessionUser;
  observer2: SessionUser;
  coordinator: SessionUser;
  ids: Record<"A" | "B" | "C" | "D" | "E" | "F", string>;
  shiftIds: [string, string];
  siteIds: [string, string];
}

const candidateRow = (externalId: string, eventTime: number, receivedAt: number, extra: Partial<NewCandidate> = {}): NewCandidate => ({
  source: "tessera",
  externalId,
  currentRevision: 1,
  stage: "first-look",
  eventTime: new Date(eventTime),
  receivedAt: new Date(receivedAt),
  updatedAt: new Date(receivedAt),
  networkSnr: 11,
  falseAlarmRatePerYear: 0.01,
  detectors: ["N1", "S1"],
  dominantClass: "bns",
  ...extra,
});

export async function writeFixtureLog(): Promise<FixtureLog> {
  const db = await getDb();
  const shifter = await createTestUser("shifter", { name: "Shifter One" });
  const shifter2 = await createTestUser("shifter", { name: "Shifter Two" });
  const observer = await createTestUser("observer", { name: "Observer One" });
  const observer2 = await createTestUser("observer", { name: "Observer Two" });
  const coordinator = await createTestUser("coordinator", { name: "Coordinator One" });
  const [siteA, siteB] = await db
    .insert(sites)
    .values([
      { code: "ALD", name: "Alado Ridge (fictional)", latitudeDeg: -30, longitudeDeg: -70, elevationM: 2300, fieldOfViewDeg2: 9 },
      { code: "KRN", name: "Kerrin Peak (fictional)", latitudeDeg: 31, longitudeDeg: -111, elevationM: 2000, fieldOfViewDeg2: 40 },
    ])
    .returning();
  const rows = await db
    .insert(candidates)
    .values([
      // A: paged, acknowledged late, reviewed, pursued; a claim released and re-claimed; a report.
      candidateRow("TX-A", s(-20), s(0), { triageState: "pursue", acknowledgedAt: new Date(s(305)), acknowledgedById: shifter.id, decidedAt: new Date(s(660)) }),
      // B: push failed, e-mail sent; dismissed straight from new.
      candidateRow("TX-B", min(60) - 40_000, min(60), { triageState: "dismissed", acknowledgedAt: new Date(min(70)), acknowledgedById: shifter.id, decidedAt: new Date(min(70)), dominantClass: "bbh" }),
      // C: a pre-merger alert (merger 30 s after receipt); no page sent yet, nobody acknowledged.
      candidateRow("TX-C", min(120) + 30_000, min(120), { stage: "early-warning" }),
      // D: acknowledged before any page, expert first, pursued later; no task claimed yet.
      candidateRow("TX-D", min(180) - 10_000, min(180), { triageState: "pursue", acknowledgedAt: new Date(min(180) + 20_000), acknowledgedById: shifter2.id, decidedAt: new Date(min(240)) }),
      // E: withdrawn a minute after receipt, never acknowledged.
      candidateRow("TX-E", min(239) - 15_000, min(239), { stage: "withdrawn", withdrawnAt: new Date(min(240)) }),
      // F: received two days earlier, outside the review range used by the tests.
      candidateRow("TX-F", T0 - 2 * 86_400_000 - 5_000, T0 - 2 * 86_400_000),
    ])
    .returning({ id: candidates.id, externalId: candidates.externalId });
  const ids = Object.fromEntries(rows.map((r) => [r.externalId.slice(3), r.id])) as FixtureLog["ids"];

  const ev = (at: number, kind: string, candidateId: string, extra: { actorId?: string; taskId?: string; fromState?: string; toState?: string } = {}) =>
    appendEvent(db, { at: new Date(at), kind, candidateId, ...extra });
  for (const [key, at] of [["A", s(0)], ["B", min(60)], ["C", min(120)], ["D", min(180)], ["E", min(239)], ["F", T0 - 2 * 86_400_000]] as const) {
    await ev(at, "candidate.created", ids[key], { toState: "new" });
  }
  await ev(s(305), "candidate.triaged", ids.A, { actorId: shifter.id, fromState: "new", toState: "acknowledged" });
  await ev(s(400), "candidate.triaged", ids.A, { actorId: shifter.id, fromState: "acknowledged", toState: "reviewing" });
  await ev(s(660), "candidate.triaged", ids.A, { actorId: shifter.id, fromState: "reviewing", toState: "pursue" });
  await ev(min(70), "candidate.triaged", ids.B, { actorId: shifter.id, fromState: "new", toState: "dismissed" });
  await ev(min(180) + 20_000, "candidate.triaged", ids.D, { actorId: shifter2.id, fromState: "new", toState: "acknowledged" });
  await ev(min(185), "candidate.triaged", ids.D, { actorId: shifter2.id, fromState: "acknowledged", toState: "expert" });
  await ev(min(240), "candidate.triaged", ids.D, { actorId: shifter2.id, fromState: "expert", toState: "pursue" });
  await ev(min(240), "candidate.withdrawn", ids.E);

  // Outbox: A's push at +5 s, e-mail +7 s, in-app +1 s (not a page "sent" in the review's sense); B's push failed.
  const page = (candidateId: string, userId: string, channel: "push" | "email" | "in-app", sentAt: number | null, kind = "page") => ({
    dedupeKey: `fixture:${candidateId}:${channel}:${kind}`,
    userId,
    channel,
    kind,
    candidateId,
    title: "page",
    body: "page",
    status: sentAt === null ? ("failed" as const) : ("sent" as const),
    nextAttemptAt: new Date(T0),
    sentAt: sentAt === null ? null : new Date(sentAt),
  });
  await db.insert(notifications).values([
    page(ids.A, shifter.id, "in-app", s(1)),
    page(ids.A, shifter.id, "push", s(5)),
    page(ids.A, shifter.id, "email", s(7)),
    page(ids.B, shifter.id, "push", null),
    page(ids.B, shifter.id, "email", min(60) + 30_000),
    { ...page(ids.C, shifter.id, "push", null), status: "pending" as const },
    page(ids.D, shifter2.id, "push", min(180) + 45_000),
  ]);

  // A's follow-up: task 1 at ALD claimed at +30 min, released at +35, re-claimed at +50; task 2 at KRN claimed at +40,
  // reported at +3 h.
  const [t1, t2] = await db
    .insert(followUpTasks)
    .values([
      { candidateId: ids.A, kind: "wide-field-tiling", siteId: siteA?.id, state: "claimed", claimedById: observer.id, claimedAt: new Date(min(50)), createdAt: new Date(min(12)), updatedAt: new Date(min(50)) },
      { candidateId: ids.A, kind: "spectroscopy", siteId: siteB?.id, state: "reported", claimedById: observer2.id, claimedAt: new Date(min(40)), reportedAt: new Date(min(180)), createdAt: new Date(min(12)), updatedAt: new Date(min(180)) },
    ])
    .returning({ id: followUpTasks.id });
  if (!t1 || !t2 || !siteA || !siteB) throw new Error("fixture insert failed");
  await ev(min(12), "task.created", ids.A, { actorId: shifter.id, taskId: t1.id, toState: "open" });
  await ev(min(12), "task.created", ids.A, { actorId: shifter.id, taskId: t2.id, toState: "open" });
  await ev(min(30), "task.state-changed", ids.A, { actorId: observer.id, taskId: t1.id, fromState: "open", toState: "claimed" });
  await ev(min(35), "task.state-changed", ids.A, { actorId: observer.id, taskId: t1.id, fromState: "claimed", toState: "open" });
  await ev(min(40), "task.state-changed", ids.A, { actorId: observer2.id, taskId: t2.id, fromState: "open", toState: "claimed" });
  await ev(min(50), "task.state-changed", ids.A, { actorId: observer.id, taskId: t1.id, fromState: "open", toState: "claimed" });
  await ev(min(180), "task.reported", ids.A, { actorId: observer2.id, taskId: t2.id, fromState: "claimed", toState: "reported" });

  const shiftRows = await db
    .insert(shifts)
    .values([
      { startsAt: new Date(min(-60)), endsAt: new Date(min(150)), primaryId: shifter.id, backupId: shifter2.id },
      { startsAt: new Date(min(150)), endsAt: new Date(min(630)), primaryId: shifter2.id, backupId: null },
    ])
    .returning({ id: shifts.id });
  return {
    shifter,
    shifter2,
    observer,
    observer2,
    coordinator,
    ids,
    shiftIds: [shiftRows[0]?.id ?? "", shiftRows[1]?.id ?? ""],
    siteIds: [siteA.id, siteB.id],
  };
}
