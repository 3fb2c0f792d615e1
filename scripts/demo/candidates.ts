import { readFile } from "node:fs/promises";
import path from "node:path";
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import type { Database } from "@/db";
import { candidates, escalations, notifications, siteObservers, sites, users } from "@/db/schema";
import { FeedGenerator } from "@/fakes/feed/generator";
import { FeedRandom } from "@/fakes/feed/random";
import { toSessionUser, type SessionUser } from "@/lib/auth/roles";
import { ingestCandidate } from "@/lib/services/ingest-trigger";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { signFeedBody } from "@/lib/feed/signature";
import { uploadSkymap } from "@/lib/data/skymaps";
import { claimTask } from "@/lib/services/claim-task";
import { createTasks } from "@/lib/services/create-tasks";
import { moveTask, reportTask } from "@/lib/services/move-task";
import { transitionCandidate } from "@/lib/services/move-card";
import { setNotifyClock } from "@/lib/notify/clock";
import { demoNetwork } from "./scenario";

const MINUTE = 60_000;

/**
 * A week of past activity, fed through the real ingest, triage and task paths with past clocks, so the boards,
 * candidate pages and the response-time review have something to show. Pages for these past candidates are
 * marked as already delivered, so the worker does not send them again on a fresh start.
 */
export async function seedPastCandidates(db: Database, now: Date): Promise<number> {
  const random = new FeedRandom("demo-week-20261201");
  const rand = () => random.next();
  const people = (await db.select().from(users)).map(toSessionUser);
  const byEmail = new Map(people.map((p) => [p.email, p]));
  const shifters = people.filter((p) => p.role === "shifter");
  const observers = people.filter((p) => p.role === "observer");
  const coordinator = byEmail.get("cleo@chirpdesk.test");
  const siteRows = await db.select().from(sites);
  // Observers claim tasks at their own sites only, so each task goes to one of its site's observers.
  const follows = await db.select().from(siteObservers);
  const observerOf = (siteId: string | null, turn: number): SessionUser => {
    const own = observers.filter((o) => follows.some((f) => f.siteId === siteId && f.userId === o.id));
    const pool = own.length > 0 ? own : observers;
    return pool[turn % pool.length] as SessionUser;
  };
  if (shifters.length === 0 || observers.length === 0 || !coordinator) return 0;

  const generator = new FeedGenerator({ seed: "demo-week", scenario: "mixed", sites: generatorSites(), trackSamples: 120 });
  const start = now.getTime() - 7 * 24 * 60 * MINUTE;
  const created: Array<{ id: string; receivedAt: number }> = [];
  for (let t = start; t < now.getTime() - 30 * MINUTE; t += (3 + rand() * 6) * 60 * MINUTE) {
    const post = generator.next(t);
    if (!post.payload) continue;
    let receivedAt = new Date(Math.max(t, Date.parse(post.payload.eventTime)) + (4 + rand() * 20) * 1000);
    // Other pipelines' reports of the same signal arrive seconds after the first, and join its candidate.
    for (let payload: typeof post.payload | null = post.payload; payload; ) {
      const at = receivedAt;
      setNotifyClock(() => at.getTime()); // page as it would have been paged then
      const result = await ingestCandidate(payload, at).finally(() => setNotifyClock(null));
      if (result.outcome === "created") created.push({ id: result.id, receivedAt: at.getTime() });
      const companion = generator.peekCompanion() ? generator.next(t) : null;
      payload = companion?.payload ?? null;
      receivedAt = new Date(at.getTime() + (1 + rand() * 8) * 1000);
    }
  }

  await markPastPagesDelivered(db);
  await seedRefusedPosts(generatorSites(), now);

  // The newest two stay new for the board; the rest were handled by whoever was on shift.
  const pursued: Array<{ candidateId: string; index: number; at: number; shifter: SessionUser }> = [];
  for (const [index, item] of created.slice(0, -2).entries()) {
    const [row] = await db.select().from(candidates).where(eq(candidates.id, item.id)).limit(1);
    if (!row || row.stage === "withdrawn") continue;
    const shifter = shifters[index % shifters.length] as SessionUser;
    let at = item.receivedAt + (0.7 + rand() * 7) * MINUTE;
    await transitionCandidate({ actor: shifter, candidateId: item.id, to: "acknowledged", via: "board", now: new Date(at) });
    at += (3 + rand() * 30) * MINUTE;
    const pursue = row.dominantClass === "bns" || row.dominantClass === "nsbh" || (row.dominantClass === "lowerGap" && rand() < 0.7);
    if (index % 9 === 4) {
      await transitionCandidate({ actor: shifter, candidateId: item.id, to: "reviewing", via: "board", now: new Date(at) });
      continue;
    }
    if (!pursue) {
      const reason = row.falseAlarmRatePerYear > 1 ? "false-alarm rate too high for follow-up" : "black-hole pair: no counterpart expected";
      await transitionCandidate({ actor: shifter, candidateId: item.id, to: index % 7 === 3 ? "expert" : "dismissed", reason, via: "board", now: new Date(at) });
      continue;
    }
    await transitionCandidate({ actor: shifter, candidateId: item.id, to: "pursue", via: "board", now: new Date(at) });
    pursued.push({ candidateId: item.id, index, at, shifter });
  }

  // Follow-up tasks. The two newest pursued candidates are still being worked tonight: each has a claimed task
  // (the newest one's is being observed) and an open one, with windows that run into the coming night. Older
  // tasks went the whole way to a report.
  for (const [order, { candidateId, index, at, shifter }] of pursued.entries()) {
    const live = order >= pursued.length - 2;
    const chosen = siteRows.slice(0, 2 + (index % 2));
    setNotifyClock(() => at);
    const tasks = await createTasks(
      shifter,
      candidateId,
      chosen.map((s, i) => ({
        kind: s.fieldOfViewDeg2 > 5 ? "wide-field-tiling" : s.fieldOfViewDeg2 < 0.1 ? "spectroscopy" : "galaxy-targeted",
        siteId: s.id,
        windowStart: new Date(at + 10 * MINUTE),
        windowEnd: new Date(live ? Math.max(at, now.getTime()) + 10 * 60 * MINUTE : at + 10 * 60 * MINUTE),
        priority: i === 0 ? 1 : 2,
        notes: "",
      })),
      new Date(at),
    ).finally(() => setNotifyClock(null));
    for (const [taskIndex, task] of tasks.entries()) {
      const observer = observerOf(task.siteId, index + taskIndex);
      if (live) {
        if (taskIndex > 0) continue; // open, waiting for an observer
        let taskAt = Math.max(at + MINUTE, now.getTime() - (40 + rand() * 60) * MINUTE);
        await claimTask(observer, task.id, new Date(taskAt));
        if (order < pursued.length - 1) continue;
        taskAt = Math.min(taskAt + (5 + rand() * 20) * MINUTE, now.getTime() - MINUTE);
        await moveTask({ actor: observer, taskId: task.id, to: "observing", now: new Date(taskAt) });
        continue;
      }
      let taskAt = at + (8 + rand() * 80) * MINUTE;
      await claimTask(observer, task.id, new Date(taskAt));
      taskAt += (10 + rand() * 60) * MINUTE;
      await moveTask({ actor: observer, taskId: task.id, to: "observing", now: new Date(taskAt) });
      if (taskAt + 3 * 60 * MINUTE > now.getTime()) continue;
      taskAt += (60 + rand() * 300) * MINUTE;
      await reportTask(observer, task.id, taskIndex === 0 ? "Tiles covered; no new transient brighter than 20.5 mag in the 90 % region." : "Three catalogued galaxies imaged; nothing new.", new Date(taskAt));
    }
  }
  await markPastPagesDelivered(db);
  await attachDemoSkymaps(db, created.map((c) => c.id));
  const ids = created.map((c) => c.id);
  if (ids.length === 0) return 0;
  const [count] = await db.select({ n: sql<number>`count(*)` }).from(candidates).where(and(inArray(candidates.id, ids)));
  return count?.n ?? 0;
}

/** Pages queued for past events were "sent" at the time, shortly after queueing; their escalation timers answered. */
async function markPastPagesDelivered(db: Database): Promise<void> {
  await db.run(sql`UPDATE notifications SET status = 'sent', attempts = 1,
    sent_at = next_attempt_at + 5000 + (abs(random()) % 40000)
    WHERE status = 'pending' AND candidate_id IS NOT NULL`);
  await db.update(notifications).set({ status: "cancelled" }).where(eq(notifications.status, "pending"));
  await db.run(sql`UPDATE notifications SET read_at = sent_at WHERE channel = 'in-app' AND read_at IS NULL`);
  await db.update(escalations).set({ status: "cancelled" }).where(eq(escalations.status, "pending"));
}

/**
 * A fictional two-lobed localisation with distance columns (made by tests/fixtures/scripts/galaxies_make_fixtures.py
 * from the same invented sky model as skymap_make_fixtures.py, plus DISTMU/DISTSIGMA/DISTNORM), attached through the
 * real upload path to the newest pursued candidates and the newest new one, so the map, distance and visibility
 * views show.
 */
async function attachDemoSkymaps(db: Database, candidateIds: string[]): Promise<void> {
  if (candidateIds.length === 0) return;
  const bytes = new Uint8Array(await readFile(path.join(process.cwd(), "scripts/demo/demo-localisation-3d.multiorder.fits.gz")));
  const rows = await db
    .select({ id: candidates.id, triageState: candidates.triageState })
    .from(candidates)
    .where(inArray(candidates.id, candidateIds))
    .orderBy(desc(candidates.receivedAt));
  const picked = [...rows.filter((r) => r.triageState === "pursue").slice(0, 2), ...rows.filter((r) => r.triageState === "new").slice(0, 1)];
  for (const row of picked) {
    await uploadSkymap({ target: { candidateId: row.id }, fileName: "demo-localisation-3d.multiorder.fits.gz", bytes, actorId: null, via: "feed" });
  }
}

const generatorSites = () => demoNetwork.detectors.map((d) => d.code);

/**
 * Three correctly signed posts the feed route refused during the week, sent through the route handler itself
 * (signed with a key of the seed's own, past clocks), so the dead-letter page shows what a refusal looks like.
 */
async function seedRefusedPosts(sites: string[], now: Date): Promise<void> {
  const key = "demo-seed-signing-key-not-a-secret";
  let clock = now.getTime() - 3 * 24 * 60 * MINUTE;
  const handle = feedIngest.with({ feedSecret: () => key, now: () => clock });
  const generator = new FeedGenerator({ seed: "refused-week", scenario: "malformed", sites, trackSamples: 120 });
  for (let sent = 0, tries = 0; sent < 3 && tries < 20; tries++) {
    const post = generator.next(clock);
    if (post.rawBody.length > 100_000) continue; // the over-long track: too big for a demo database
    clock += (5 + tries * 37) * MINUTE;
    const headers = { "content-type": "application/json", ...signFeedBody(key, post.rawBody, clock) };
    await handle(new Request("http://seed.invalid/api/v1/feed/candidates", { method: "POST", headers, body: post.rawBody }));
    sent++;
  }
}
