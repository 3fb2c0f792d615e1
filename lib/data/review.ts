import { sql, type SQL } from "drizzle-orm";
import { getDb, type Tx } from "@/db";

/** The triage states that count as a decision. */
export type DecisionState = "pursue" | "dismissed" | "expert";

/** A first occurrence in the audit log: when, and who. */
export interface Stamp {
  atMs: number;
  actorId: string | null;
}

/** A candidate's own columns, as both the review query row and the timeline facts carry them (times in Unix ms). */
export interface CandidateColumns {
  id: string;
  source: string;
  externalId: string;
  stage: string;
  dominantClass: string | null;
  triageState: string;
  ownerId: string | null;
  eventTimeMs: number;
  receivedAtMs: number;
  withdrawnAtMs: number | null;
}

/** One row of the review's query (times in Unix ms): the candidate's columns and its first milestones in the log. */
export interface CandidateMilestones extends CandidateColumns {
  acknowledgedAtMs: number | null;
  acknowledgedById: string | null;
  decidedAtMs: number | null;
  /** first page (or escalated page) sent by push or e-mail, from the outbox */
  firstPageAtMs: number | null;
  /** first triage move out of "new" */
  leftNew: Stamp | null;
  /** first move into pursue / dismissed / expert */
  firstDecision: (Stamp & { state: DecisionState }) | null;
  firstPursueAtMs: number | null;
  /** first task.state-changed to "claimed" of any of its (counted) tasks */
  firstClaim: Stamp | null;
  /** first task.reported of any of its (counted) tasks */
  firstReport: Stamp | null;
  taskCount: number;
  cancelledTaskCount: number;
}

/** A shift with the names of its primary and backup. */
export interface ShiftInfo {
  id: string;
  startsAtMs: number;
  endsAtMs: number;
  primaryName: string;
  backupName: string | null;
}

export interface ReviewFilters {
  fromMs: number;
  toMs: number;
  sourceClass?: string;
  stage?: string;
  siteId?: string;
}

/**
 * The candidates received in [from, to) (and before `now`; received_at is the first trigger's receipt), with the filters that live in the candidates table;
 * with a site filter, only candidates with a task at that site.
 */
function candidateSet(f: ReviewFilters, nowMs: number): SQL {
  const parts = [sql`c.received_at >= ${f.fromMs} AND c.received_at < ${Math.min(f.toMs, nowMs + 1)}`];
  // A candidate merged into another is counted there (its triggers and first receipt went with them).
  parts.push(sql`c.merged_into_id IS NULL`);
  if (f.sourceClass) parts.push(sql`c.dominant_class = ${f.sourceClass}`);
  if (f.stage) parts.push(sql`c.stage = ${f.stage}`);
  if (f.siteId) parts.push(sql`EXISTS (SELECT 1 FROM follow_up_tasks t WHERE t.candidate_id = c.id AND t.site_id = ${f.siteId})`);
  return sql.join(parts, sql` AND `);
}

/**
 * The first event of one kind for the candidate `c`, as "at|actor|to_state". Each is one seek into
 * events_candidate_kind_idx (candidate_id, kind, at, …), which covers every column read, so no table row is touched.
 */
function firstEvent(kind: string, condition: SQL, nowMs: number): SQL {
  return sql`(SELECT printf('%d|%s|%s', e.at, ifnull(e.actor_id, ''), ifnull(e.to_state, '')) FROM events e
    WHERE e.candidate_id = c.id AND e.kind = ${kind} AND ${condition} AND e.at <= ${nowMs} ORDER BY e.at LIMIT 1)`;
}

/** With a site filter, only that site's tasks count toward claims, reports and the task counts. */
const atSite = (f: ReviewFilters, column: SQL) =>
  f.siteId ? sql` AND ${column} IN (SELECT t.id FROM follow_up_tasks t WHERE t.candidate_id = c.id AND t.site_id = ${f.siteId})` : sql``;

/**
 * The review's read: one statement over the candidates in range (received_at index), each with its first page
 * from the outbox and its first milestones from the audit log as correlated index seeks, so the cost follows the
 * number of candidates in range, not the size of the log. It returns a single JSON array (json_group_array): one
 * value to carry out of libSQL instead of thousands of row objects, which is where most of the time went.
 */
export const reviewQueries = {
  candidates: (f: ReviewFilters, nowMs: number) => sql`
    SELECT json_group_array(json_array(c.id, c.source, c.external_id, c.stage, c.dominant_class, c.triage_state,
      c.owner_id, c.event_time, c.received_at, c.withdrawn_at,
      CASE WHEN c.acknowledged_at <= ${nowMs} THEN c.acknowledged_at END,
      CASE WHEN c.acknowledged_at <= ${nowMs} THEN c.acknowledged_by_id END,
      CASE WHEN c.decided_at <= ${nowMs} THEN c.decided_at END,
      (SELECT MIN(n.sent_at) FROM notifications n WHERE n.candidate_id = c.id AND n.kind IN ('page', 'escalation')
        AND n.channel IN ('push', 'email') AND n.sent_at <= ${nowMs}),
      ${firstEvent("candidate.triaged", sql`e.from_state = 'new' AND e.to_state <> 'new'`, nowMs)},
      ${firstEvent("candidate.triaged", sql`e.to_state IN ('pursue', 'dismissed', 'expert')`, nowMs)},
      ${firstEvent("candidate.triaged", sql`e.to_state = 'pursue'`, nowMs)},
      ${firstEvent("task.state-changed", sql`e.to_state = 'claimed'${atSite(f, sql`e.task_id`)}`, nowMs)},
      ${firstEvent("task.reported", sql`1 = 1${atSite(f, sql`e.task_id`)}`, nowMs)},
      (SELECT printf('%d|%d', count(*), total(t2.state = 'cancelled')) FROM follow_up_tasks t2
        WHERE t2.candidate_id = c.id${f.siteId ? sql` AND t2.site_id = ${f.siteId}` : sql``})
    )) AS j
    FROM (SELECT * FROM candidates c WHERE ${candidateSet(f, nowMs)} ORDER BY c.received_at) c`,
} as const;

type Cell = string | number | null;

const str = (v: Cell | undefined) => (v === null || v === undefined ? null : String(v));
const num = (v: Cell | undefined) => (v === null || v === undefined ? null : Number(v));

/** "at|actor|state" from firstEvent() into its parts. */
function parseStamp(v: Cell | undefined): (Stamp & { state: string }) | null {
  if (typeof v !== "string") return null;
  const [at, actor, state] = v.split("|");
  return { atMs: Number(at), actorId: actor || null, state: state ?? "" };
}

/** Per-candidate milestones for the review, from the one query above (lib/review/facts.ts reduces them to facts). */
export async function loadCandidateMilestones(f: ReviewFilters, nowMs: number, q?: Tx): Promise<CandidateMilestones[]> {
  const db = q ?? (await getDb());
  const [row] = await db.all<{ j: string | null }>(reviewQueries.candidates(f, nowMs));
  const rows = row?.j ? (JSON.parse(row.j) as Cell[][]) : [];
  return rows.map((r) => {
    const decision = parseStamp(r[15]);
    const tasks = String(r[19] ?? "0|0").split("|");
    return {
      id: String(r[0]),
      source: String(r[1]),
      externalId: String(r[2]),
      stage: String(r[3]),
      dominantClass: str(r[4]),
      triageState: String(r[5]),
      ownerId: str(r[6]),
      eventTimeMs: Number(r[7]),
      receivedAtMs: Number(r[8]),
      withdrawnAtMs: num(r[9]),
      acknowledgedAtMs: num(r[10]),
      acknowledgedById: str(r[11]),
      decidedAtMs: num(r[12]),
      firstPageAtMs: num(r[13]),
      leftNew: parseStamp(r[14]),
      firstDecision: decision ? { ...decision, state: decision.state as DecisionState } : null,
      firstPursueAtMs: parseStamp(r[16])?.atMs ?? null,
      firstClaim: parseStamp(r[17]),
      firstReport: parseStamp(r[18]),
      taskCount: Number(tasks[0] ?? 0),
      cancelledTaskCount: Number(tasks[1] ?? 0),
    };
  });
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
