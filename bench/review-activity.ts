import { randomUUID } from "node:crypto";
import type { Client, InStatement } from "@libsql/client";

/**
 * A synthetic year of desk activity for the review benchmark: fictional people, sites and candidates, written with
 * multi-row INSERTs inside one write transaction per table. Deterministic (seeded PRNG), so runs compare.
 */
export interface ActivitySize {
  candidates: number;
  tasks: number;
  events: number;
}

type Value = string | number | null;

function mulberry32(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

async function bulkInsert(client: Client, table: string, columns: string[], rows: Value[][]): Promise<void> {
  const perStatement = Math.max(1, Math.floor(30_000 / columns.length / 4));
  const statements: InStatement[] = [];
  for (let i = 0; i < rows.length; i += perStatement) {
    const chunk = rows.slice(i, i + perStatement);
    const placeholders = chunk.map(() => `(${columns.map(() => "?").join(",")})`).join(",");
    statements.push({ sql: `INSERT INTO ${table} (${columns.join(",")}) VALUES ${placeholders}`, args: chunk.flat() });
  }
  if (statements.length) await client.batch(statements, "write");
}

export async function writeYearOfActivity(client: Client, size: ActivitySize, endMs: number): Promise<void> {
  const rand = mulberry32(20_260_101);
  const logNormal = (medianMs: number, sigma: number) => {
    const u = Math.max(rand(), 1e-12);
    const z = Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
    return Math.round(medianMs * Math.exp(sigma * z));
  };
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)] as T;
  const startMs = endMs - 365 * 86_400_000;

  const shifters = Array.from({ length: 6 }, (_, i) => ({ id: randomUUID(), name: `Bench shifter ${i + 1}`, role: "shifter" }));
  const observers = Array.from({ length: 6 }, (_, i) => ({ id: randomUUID(), name: `Bench observer ${i + 1}`, role: "observer" }));
  const coordinators = Array.from({ length: 2 }, (_, i) => ({ id: randomUUID(), name: `Bench coordinator ${i + 1}`, role: "coordinator" }));
  const people = [...shifters, ...observers, ...coordinators];
  await bulkInsert(client, "users", ["id", "email", "name", "password_hash", "role", "time_zone", "initials", "created_at"],
    people.map((p, i) => [p.id, `bench${i}@example.test`, p.name, "x", p.role, "UTC", "BX", startMs]));
  const siteIds = ["BX1", "BX2", "BX3", "BX4"].map((code, i) => ({ id: randomUUID(), code, i }));
  await bulkInsert(client, "sites", ["id", "code", "name", "latitude_deg", "longitude_deg", "elevation_m", "field_of_view_deg2", "created_at"],
    siteIds.map((s) => [s.id, s.code, `Bench site ${s.code}`, -30 + s.i * 20, s.i * 40, 1000, 5, startMs]));

  const shiftMs = 8 * 3_600_000;
  const shiftRows: Value[][] = [];
  for (let t = startMs, k = 0; t < endMs; t += shiftMs, k++) {
    shiftRows.push([randomUUID(), t, t + shiftMs, (shifters[k % 6] as { id: string }).id, (shifters[(k + 1) % 6] as { id: string }).id, "", startMs]);
  }
  await bulkInsert(client, "shifts", ["id", "starts_at", "ends_at", "primary_id", "backup_id", "notes", "created_at"], shiftRows);

  const candidates: Value[][] = [];
  const tasks: Value[][] = [];
  const events: Value[][] = [];
  const outbox: Value[][] = [];
  const ev = (at: number, kind: string, actor: string | null, cid: string | null, tid: string | null, from: string | null, to: string | null) =>
    events.push([at, actor, kind, cid, tid, from, to, "{}"]);
  const note = (cid: string | null, uid: string | null, kind: string, channel: string, at: number | null, created: number) =>
    outbox.push([randomUUID(), randomUUID(), uid, channel, kind, cid, "t", "b", at === null ? "pending" : "sent", created, at, created]);

  const receipts = Array.from({ length: size.candidates }, () => startMs + rand() * (endMs - startMs - 86_400_000)).sort((a, b) => a - b);
  const pursuedTasks = Math.ceil(size.tasks / (size.candidates * 0.36));
  for (const [i, r] of receipts.entries()) {
    const receivedAt = Math.round(r);
    const id = randomUUID();
    const slot = Math.floor((receivedAt - startMs) / shiftMs);
    const primary = (shifters[slot % 6] as { id: string }).id;
    const eventTime = rand() < 0.05 ? receivedAt + 5_000 + logNormal(20_000, 0.5) : receivedAt - logNormal(25_000, 0.6);
    const cls = pick(["bns", "nsbh", "bbh", "bbh", "bbh", "lowerGap"] as const);
    const stage = pick(["first-look", "confirmed", "confirmed", "revised", "early-warning"] as const);
    ev(receivedAt, "candidate.created", null, id, null, null, "new");
    for (let k = 0, n = Math.floor(rand() * 3); k < n; k++) ev(receivedAt + logNormal(600_000, 1), "candidate.revised", null, id, null, null, null);
    ev(receivedAt + 50, "page.queued", null, id, null, null, null);
    const pageAt = rand() < 0.97 ? receivedAt + logNormal(8_000, 0.5) : null;
    for (const channel of ["push", "email", "in-app"]) note(id, primary, "page", channel, pageAt === null ? null : pageAt + (channel === "email" ? 1500 : 0), receivedAt);
    let ackAt: number | null = null;
    let decidedAt: number | null = null;
    let state = "new";
    const acker = rand() < 0.9 ? primary : (shifters[(slot + 1) % 6] as { id: string }).id;
    if (rand() < 0.95 && i < size.candidates - 3) {
      ackAt = (pageAt ?? receivedAt) + logNormal(90_000, 0.9);
      if (ackAt - receivedAt > 300_000) {
        note(id, (shifters[(slot + 1) % 6] as { id: string }).id, "page", "push", receivedAt + 300_500, receivedAt + 300_000);
        ev(receivedAt + 300_000, "escalation.fired", null, id, null, null, null);
      }
      ev(ackAt, "candidate.triaged", acker, id, null, "new", "acknowledged");
      state = "acknowledged";
      if (rand() < 0.9) {
        let t = ackAt + logNormal(300_000, 0.8);
        if (rand() < 0.5) {
          ev(t, "candidate.triaged", acker, id, null, "acknowledged", "reviewing");
          state = "reviewing";
        }
        t += logNormal(300_000, 0.8);
        const decision = rand() < 0.4 ? "pursue" : rand() < 0.85 ? "dismissed" : "expert";
        ev(t, "candidate.triaged", acker, id, null, state, decision);
        state = decision;
        decidedAt = t;
        if (decision === "pursue") {
          for (let k = 0; k < pursuedTasks && tasks.length < size.tasks; k++) {
            const tid = randomUUID();
            const created = t + 60_000 + logNormal(120_000, 0.5);
            ev(created, "task.created", acker, id, tid, null, "open");
            let taskState = "open";
            let claimedAt: number | null = null;
            let claimer: string | null = null;
            let reportedAt: number | null = null;
            let cancelledAt: number | null = null;
            if (rand() < 0.8) {
              claimedAt = created + logNormal(1_200_000, 1);
              claimer = (observers[Math.floor(rand() * 6)] as { id: string }).id;
              ev(claimedAt, "task.state-changed", claimer, id, tid, "open", "claimed");
              taskState = "claimed";
              if (rand() < 0.75) {
                const obs = claimedAt + logNormal(1_800_000, 1);
                ev(obs, "task.state-changed", claimer, id, tid, "claimed", "observing");
                reportedAt = obs + logNormal(7_200_000, 0.8);
                ev(reportedAt, "task.reported", claimer, id, tid, "observing", "reported");
                taskState = "reported";
              }
            } else if (rand() < 0.5) {
              cancelledAt = created + logNormal(3_600_000, 1);
              ev(cancelledAt, "task.cancelled", acker, id, tid, "open", "cancelled");
              taskState = "cancelled";
            }
            note(id, claimer ?? (observers[0] as { id: string }).id, "task", "push", created + 2000, created);
            tasks.push([tid, id, pick(["wide-field-tiling", "galaxy-targeted", "spectroscopy", "other"]), pick(siteIds).id, 2, "", taskState,
              claimer, claimedAt, reportedAt, cancelledAt, acker, created, reportedAt ?? claimedAt ?? created, 1]);
          }
        }
      }
    }
    candidates.push([id, "bench", `BX${String(i).padStart(6, "0")}`, 1, stage, state, acker, Math.round(eventTime), receivedAt,
      decidedAt ?? ackAt ?? receivedAt, ackAt, ackAt === null ? null : acker, decidedAt, 8 + rand() * 20, 10 ** (-3 + rand() * 5), '["N1","S1"]',
      1 + rand() * 30, cls, 1]);
  }
  // Everything else the log holds (notes, assignments, sky maps), so the review's queries skip realistic noise.
  while (events.length < size.events) {
    const row = candidates[Math.floor(rand() * candidates.length)] as Value[];
    ev((row[8] as number) + logNormal(3_600_000, 1.5), pick(["candidate.note-added", "candidate.assigned", "skymap.uploaded"]), null, row[0] as string, null, null, null);
  }
  events.sort((a, b) => (a[0] as number) - (b[0] as number));
  await bulkInsert(client, "candidates", ["id", "source", "external_id", "current_revision", "stage", "triage_state", "owner_id", "event_time",
    "received_at", "updated_at", "acknowledged_at", "acknowledged_by_id", "decided_at", "network_snr", "false_alarm_rate_per_year",
    "detectors", "chirp_mass_detector_frame", "dominant_class", "version"], candidates);
  await bulkInsert(client, "follow_up_tasks", ["id", "candidate_id", "kind", "site_id", "priority", "notes", "state", "claimed_by_id",
    "claimed_at", "reported_at", "cancelled_at", "created_by_id", "created_at", "updated_at", "version"], tasks);
  await bulkInsert(client, "events", ["at", "actor_id", "kind", "candidate_id", "task_id", "from_state", "to_state", "data"], events.slice(0, size.events));
  await bulkInsert(client, "notifications", ["id", "dedupe_key", "user_id", "channel", "kind", "candidate_id", "title", "body", "status",
    "next_attempt_at", "sent_at", "created_at"], outbox);
}
