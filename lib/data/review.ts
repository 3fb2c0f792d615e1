import { sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db";
import {
  buildFacts,
  type CandidateRow,
  type MilestoneRow,
  type PageRow,
  type TaskCountRow,
  type TriageEventRow,
} from "@/lib/review/facts";
import type { ShiftInfo } from "@/lib/review/groups";
import type { CandidateFacts } from "@/lib/review/timeline";
import type { Tx } from "./events";

export interface ReviewFilters {
  fromMs: number;
  toMs: number;
  sourceClass?: string;
  stage?: string;
  siteId?: string;
}

/**
 * The candidates received in [from, to) (and before `now`), with the filters that live in the candidates table.
 * Every other query keeps to this set, so each returns rows of candidates in range only.
 */
function candidateSet(f: ReviewFilters, nowMs: number): SQL {
  const parts = [sql`c.received_at >= ${f.fromMs} AND c.received_at < ${Math.min(f.toMs, nowMs + 1)}`];
  if (f.sourceClass) parts.push(sql`c.dominant_class = ${f.sourceClass}`);
  if (f.stage) parts.push(sql`c.stage = ${f.stage}`);
  return sql.join(parts, sql` AND `);
}

/**
 * Event rows of candidates in range. The unary plus keeps SQLite on the (kind, at) index with the candidate set as
 * an in-memory list; left to itself it walks every event of every candidate through events_candidate_idx.
 */
const eventsOfSet = (f: ReviewFilters, nowMs: number) =>
  sql`e.at >= ${f.fromMs} AND e.at <= ${nowMs} AND +e.candidate_id IN (SELECT c.id FROM candidates c WHERE ${candidateSet(f, nowMs)})`;

/** With a site filter, only that site's tasks count toward claims and reports. */
const taskAtSite = (f: ReviewFilters) =>
  f.siteId ? sql` AND e.task_id IN (SELECT id FROM follow_up_tasks WHERE site_id = ${f.siteId})` : sql``;

/**
 * The review's reads: six range queries over indexes, whatever the number of candidates (no per-candidate query).
 * Each returns a single JSON array (SQLite's json_group_array): one value to carry out of libSQL instead of
 * thousands of row objects, which is where most of the time went.
 */
export const reviewQueries = {
  candidates: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(c.id, c.source, c.external_id, c.stage, c.dominant_class, c.triage_state,
      c.owner_id, c.event_time, c.received_at, c.withdrawn_at,
      CASE WHEN c.acknowledged_at <= ${nowMs} THEN c.acknowledged_at END,
      CASE WHEN c.acknowledged_at <= ${nowMs} THEN c.acknowledged_by_id END,
      CASE WHEN c.decided_at <= ${nowMs} THEN c.decided_at END)) AS j
    FROM (SELECT * FROM candidates c WHERE ${candidateSet(f, nowMs)} ORDER BY c.received_at) c`,
  /** the first page actually sent (push or e-mail; a first page or an escalated one) per candidate, from the outbox */
  pages: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(cid, first_at)) AS j FROM (
      SELECT n.candidate_id AS cid, MIN(n.sent_at) AS first_at
      FROM candidates c JOIN notifications n ON n.candidate_id = c.id
      WHERE ${candidateSet(f, nowMs)} AND n.kind IN ('page', 'escalation') AND n.channel IN ('push', 'email')
        AND n.sent_at IS NOT NULL AND n.sent_at <= ${nowMs}
      GROUP BY n.candidate_id)`,
  triageEvents: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(e.candidate_id, e.at, e.from_state, e.to_state, e.actor_id)) AS j
    FROM events e WHERE e.kind = 'candidate.triaged' AND ${eventsOfSet(f, nowMs)}`,
  taskCounts: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(cid, n, cancelled)) AS j FROM (
      SELECT t.candidate_id AS cid, count(*) AS n, sum(t.state = 'cancelled') AS cancelled
      FROM follow_up_tasks t
      WHERE t.candidate_id IN (SELECT c.id FROM candidates c WHERE ${candidateSet(f, nowMs)})
        ${f.siteId ? sql`AND t.site_id = ${f.siteId}` : sql``}
      GROUP BY t.candidate_id)`,
  /** first claim per candidate; with a single min(), SQLite takes the bare actor_id from that same row */
  claims: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(cid, first_at, actor)) AS j FROM (
      SELECT e.candidate_id AS cid, MIN(e.at) AS first_at, e.actor_id AS actor
      FROM events e
      WHERE e.kind = 'task.state-changed' AND e.to_state = 'claimed' AND ${eventsOfSet(f, nowMs)}${taskAtSite(f)}
      GROUP BY e.candidate_id)`,
  reports: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(cid, first_at, actor)) AS j FROM (
      SELECT e.candidate_id AS cid, MIN(e.at) AS first_at, e.actor_id AS actor
      FROM events e
      WHERE (e.kind = 'task.reported' OR (e.kind = 'task.state-changed' AND e.to_state = 'reported'))
        AND ${eventsOfSet(f, nowMs)}${taskAtSite(f)}
      GROUP BY e.candidate_id)`,
} as const;

type Cell = string | number | null;

async function jsonRows(db: Tx, query: SQL): Promise<Cell[][]> {
  const [row] = await db.all<{ j: string | null }>(query);
  return row?.j ? (JSON.parse(row.j) as Cell[][]) : [];
}

const str = (v: Cell) => (v === null ? null : String(v));
const num = (v: Cell) => (v === null ? null : Number(v));

/** Per-candidate facts for the review, built in one pass over the six queries' results. */
export async function loadCandidateFacts(f: ReviewFilters, nowMs: number, q?: Tx): Promise<CandidateFacts[]> {
  const db = q ?? (await getDb());
  const candidates: CandidateRow[] = (await jsonRows(db, reviewQueries.candidates(f, nowMs))).map((r) => ({
    id: String(r[0]),
    source: String(r[1]),
    externalId: String(r[2]),
    stage: String(r[3]),
    dominantClass: str(r[4] ?? null),
    triageState: String(r[5]),
    ownerId: str(r[6] ?? null),
    eventTimeMs: Number(r[7]),
    receivedAtMs: Number(r[8]),
    withdrawnAtMs: num(r[9] ?? null),
    acknowledgedAtMs: num(r[10] ?? null),
    acknowledgedById: str(r[11] ?? null),
    decidedAtMs: num(r[12] ?? null),
  }));
  if (candidates.length === 0) return [];
  const pages: PageRow[] = (await jsonRows(db, reviewQueries.pages(f, nowMs))).map((r) => ({
    candidateId: String(r[0]),
    firstSentAtMs: Number(r[1]),
  }));
  const triageEvents: TriageEventRow[] = (await jsonRows(db, reviewQueries.triageEvents(f, nowMs))).map((r) => ({
    candidateId: String(r[0]),
    atMs: Number(r[1]),
    fromState: str(r[2] ?? null),
    toState: str(r[3] ?? null),
    actorId: str(r[4] ?? null),
  }));
  const taskCounts: TaskCountRow[] = (await jsonRows(db, reviewQueries.taskCounts(f, nowMs))).map((r) => ({
    candidateId: String(r[0]),
    taskCount: Number(r[1]),
    cancelledCount: Number(r[2]),
  }));
  const milestone = (r: Cell[]): MilestoneRow => ({ candidateId: String(r[0]), atMs: Number(r[1]), actorId: str(r[2] ?? null) });
  const claims = (await jsonRows(db, reviewQueries.claims(f, nowMs))).map(milestone);
  const reports = (await jsonRows(db, reviewQueries.reports(f, nowMs))).map(milestone);
  return buildFacts({ candidates, pages, triageEvents, taskCounts, claims, reports }, { siteOnly: Boolean(f.siteId) });
}

/** Shifts overlapping [from, to), with the names of their primary and backup. */
export async function loadShifts(fromMs: number, toMs: number, q?: Tx): Promise<ShiftInfo[]> {
  const db = q ?? (await getDb());
  return db.all<ShiftInfo>(sql`
    SELECT s.id, s.starts_at AS "startsAtMs", s.ends_at AS "endsAtMs", p.name AS "primaryName", b.name AS "backupName"
    FROM shifts s JOIN users p ON p.id = s.primary_id LEFT JOIN users b ON b.id = s.backup_id
    WHERE s.starts_at < ${toMs} AND s.ends_at > ${fromMs}
    ORDER BY s.starts_at`);
}

export async function loadShift(id: string, q?: Tx): Promise<ShiftInfo | null> {
  const db = q ?? (await getDb());
  const [row] = await db.all<ShiftInfo>(sql`
    SELECT s.id, s.starts_at AS "startsAtMs", s.ends_at AS "endsAtMs", p.name AS "primaryName", b.name AS "backupName"
    FROM shifts s JOIN users p ON p.id = s.primary_id LEFT JOIN users b ON b.id = s.backup_id
    WHERE s.id = ${id}`);
  return row ?? null;
}

export interface PersonOption {
  id: string;
  name: string;
  role: string;
}
export interface SiteOption {
  id: string;
  code: string;
  name: string;
}

export async function loadPeople(q?: Tx): Promise<PersonOption[]> {
  const db = q ?? (await getDb());
  return db.all<PersonOption>(sql`SELECT id, name, role FROM users ORDER BY name`);
}

export async function loadSites(q?: Tx): Promise<SiteOption[]> {
  const db = q ?? (await getDb());
  return db.all<SiteOption>(sql`SELECT id, code, name FROM sites ORDER BY code`);
}

export interface DecisionRow {
  candidateId: string;
  externalId: string;
  toState: string;
  atMs: number;
  actorName: string | null;
}

/** Triage decisions taken in [from, to), oldest first (the handoff's "decisions"). */
export async function loadDecisions(fromMs: number, toMs: number, q?: Tx): Promise<DecisionRow[]> {
  const db = q ?? (await getDb());
  return db.all<DecisionRow>(sql`
    SELECT e.candidate_id AS "candidateId", c.external_id AS "externalId", e.to_state AS "toState", e.at AS "atMs",
           u.name AS "actorName"
    FROM events e JOIN candidates c ON c.id = e.candidate_id LEFT JOIN users u ON u.id = e.actor_id
    WHERE e.kind = 'candidate.triaged' AND e.at >= ${fromMs} AND e.at < ${toMs}
      AND e.to_state IN ('pursue', 'dismissed', 'expert')
    ORDER BY e.at, e.id`);
}

export interface LiveTaskRow {
  id: string;
  candidateId: string;
  externalId: string;
  kind: string;
  state: string;
  priority: number;
  siteCode: string | null;
  claimedByName: string | null;
  windowEndMs: number | null;
}

/** Follow-up tasks still in play (open, claimed, observing), most urgent and newest first, plus how many there are. */
export async function loadLiveTasks(limit: number, q?: Tx): Promise<{ total: number; rows: LiveTaskRow[] }> {
  const db = q ?? (await getDb());
  const [count] = await db.all<{ n: number }>(
    sql`SELECT count(*) AS n FROM follow_up_tasks WHERE state IN ('open', 'claimed', 'observing')`,
  );
  const rows = await db.all<LiveTaskRow>(sql`
    SELECT t.id, t.candidate_id AS "candidateId", c.external_id AS "externalId", t.kind, t.state, t.priority,
           s.code AS "siteCode", u.name AS "claimedByName", t.window_end AS "windowEndMs"
    FROM follow_up_tasks t JOIN candidates c ON c.id = t.candidate_id
      LEFT JOIN sites s ON s.id = t.site_id LEFT JOIN users u ON u.id = t.claimed_by_id
    WHERE t.state IN ('open', 'claimed', 'observing')
    ORDER BY t.priority, t.created_at DESC
    LIMIT ${limit}`);
  return { total: count?.n ?? 0, rows };
}

export interface HandoffRecipient {
  id: string;
  name: string;
  timeZone: string;
  /** why they get it */
  as: "outgoing" | "incoming" | "coordinator";
}

/**
 * Who hears about a shift's end: its primary and backup, whoever is on the shift covering its end instant, and
 * every active coordinator. Each person once, under the first reason that applies.
 */
export async function loadHandoffRecipients(shiftId: string, endsAtMs: number, q?: Tx): Promise<HandoffRecipient[]> {
  const db = q ?? (await getDb());
  const rows = await db.all<HandoffRecipient & { rank: number }>(sql`
    SELECT u.id, u.name, u.time_zone AS "timeZone", x.role_as AS "as", x.rank FROM (
      SELECT primary_id AS uid, 'outgoing' AS role_as, 0 AS rank FROM shifts WHERE id = ${shiftId}
      UNION ALL SELECT backup_id, 'outgoing', 0 FROM shifts WHERE id = ${shiftId}
      UNION ALL SELECT primary_id, 'incoming', 1 FROM shifts WHERE id <> ${shiftId} AND starts_at <= ${endsAtMs} AND ends_at > ${endsAtMs}
      UNION ALL SELECT backup_id, 'incoming', 1 FROM shifts WHERE id <> ${shiftId} AND starts_at <= ${endsAtMs} AND ends_at > ${endsAtMs}
      UNION ALL SELECT id, 'coordinator', 2 FROM users WHERE role = 'coordinator'
    ) x JOIN users u ON u.id = x.uid
    WHERE u.disabled_at IS NULL
    ORDER BY x.rank, u.name`);
  const seen = new Set<string>();
  return rows
    .filter((r) => (seen.has(r.id) ? false : (seen.add(r.id), true)))
    .map(({ id, name, timeZone, as }) => ({ id, name, timeZone, as }));
}
