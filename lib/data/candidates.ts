import { and, asc, count, desc, eq, gte, inArray, isNull, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db";
import {
  candidateNotes,
  candidateRevisions,
  candidates,
  derivedQuantities,
  events,
  followUpTasks,
  users,
  type SourceClass,
  type Stage,
  type TriageState,
} from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";
import type { CandidateListQuery, CandidateSortKey } from "@/lib/validations/candidates";
import { appendEvent } from "./events";
import { boardAckDeadlines } from "@/lib/validations/deadlines";
import { getSetting } from "./settings";

export interface PersonRef {
  id: string;
  name: string;
  initials: string;
}

/** One card of the triage board: only what the card draws, times as epoch milliseconds. */
export interface BoardCard {
  id: string;
  externalId: string;
  source: string;
  revision: number;
  stage: Stage;
  triageState: TriageState;
  version: number;
  eventTime: number;
  receivedAt: number;
  /** last change of any kind (triage move, assignment, revision); columns after New list the latest first */
  updatedAt: number;
  acknowledgedAt: number | null;
  /** who acknowledged it (null before, or when the acknowledgement came from no one, e.g. the demo seed) */
  acknowledgedBy: PersonRef | null;
  withdrawn: boolean;
  owner: PersonRef | null;
  networkSnr: number;
  falseAlarmRatePerYear: number;
  detectors: string[];
  chirpMassDetectorFrame: number | null;
  chirpMassDetectorFrameSd: number | null;
  classes: Record<SourceClass, number> | null;
  /** fitted coalescence time, seconds after eventTime (early warnings count down to it) */
  coalescenceTimeS: number | null;
  /** probability of astrophysical origin (derived.astroProbability.pAstro) */
  pAstro: number | null;
  /** the chirp fit's model, its reduced χ² and why there is no chirp mass (read into words by lib/format/chirp-status) */
  chirpModel: string | null;
  chirpReducedChiSquare: number | null;
  chirpMassError: string | null;
  liveTaskCount: number;
  /** how many pipelines' triggers this candidate groups */
  triggerCount: number;
}

export interface BoardData {
  cards: BoardCard[];
  deadlines: { acknowledgeWarnMinutes: number; acknowledgeAlarmMinutes: number };
  /** the server clock when read, so clients tick from server time */
  serverNow: number;
  windowDays: number;
}

/** Decided cards (Pursue, Dismissed) leave the board after this many days without change; the list keeps them. */
export const BOARD_WINDOW_DAYS = 14;
const BOARD_LIMIT = 2000;

const liveTasks = sql<number>`(select count(*) from ${followUpTasks} where ${followUpTasks.candidateId} = ${candidates.id} and ${followUpTasks.state} in ('open', 'claimed', 'observing'))`;
const derivedField = <T>(path: string) => sql<T | null>`json_extract(${derivedQuantities.derived}, ${path})`;
const coalescence = derivedField<number>("$.coalescenceTime");

/** The person who acknowledged a card (a second join of users). */
const ackUser = alias(users, "ack_user");

/** Every card of the triage board in one query (current revision's derived numbers joined), newest first. */
export async function getBoard(now: Date = new Date()): Promise<BoardData> {
  const db = await getDb();
  const since = new Date(now.getTime() - BOARD_WINDOW_DAYS * 86_400_000);
  const [rows, deadlines] = await Promise.all([
    db
      .select({
        c: candidates,
        owner: { id: users.id, name: users.name, initials: users.initials },
        acker: { id: ackUser.id, name: ackUser.name, initials: ackUser.initials },
        sd: derivedQuantities.chirpMassDetectorFrameSd,
        pBns: derivedQuantities.pBns,
        pNsbh: derivedQuantities.pNsbh,
        pBbh: derivedQuantities.pBbh,
        pLowerGap: derivedQuantities.pLowerGap,
        coalescence,
        pAstro: derivedField<number>("$.astroProbability.pAstro"),
        chirpModel: derivedField<string>("$.fit.model"),
        chirpChi: derivedField<number>("$.fit.reducedChiSquare"),
        chirpMassError: derivedField<string>("$.chirpMassError"),
        liveTasks,
      })
      .from(candidates)
      .leftJoin(users, eq(users.id, candidates.ownerId))
      .leftJoin(ackUser, eq(ackUser.id, candidates.acknowledgedById))
      .leftJoin(
        candidateRevisions,
        and(eq(candidateRevisions.triggerId, candidates.preferredTriggerId), eq(candidateRevisions.revision, candidates.currentRevision)),
      )
      .leftJoin(derivedQuantities, eq(derivedQuantities.revisionId, candidateRevisions.id))
      .where(
        and(
          isNull(candidates.mergedIntoId),
          or(inArray(candidates.triageState, ["new", "acknowledged", "reviewing", "expert"]), gte(candidates.updatedAt, since)),
        ),
      )
      .orderBy(desc(candidates.receivedAt))
      .limit(BOARD_LIMIT),
    getSetting("deadlines"),
  ]);
  const cards = rows.map(({ c, owner, acker, sd, pBns, pNsbh, pBbh, pLowerGap, coalescence: tc, pAstro, chirpModel, chirpChi, chirpMassError, liveTasks: n }): BoardCard => ({
    id: c.id,
    externalId: c.externalId,
    source: c.source,
    revision: c.currentRevision,
    stage: c.stage,
    triageState: c.triageState,
    version: c.version,
    eventTime: c.eventTime.getTime(),
    receivedAt: c.receivedAt.getTime(),
    updatedAt: c.updatedAt.getTime(),
    acknowledgedAt: c.acknowledgedAt?.getTime() ?? null,
    acknowledgedBy: acker?.id ? acker : null,
    withdrawn: c.stage === "withdrawn" || c.withdrawnAt !== null,
    owner: owner?.id ? owner : null,
    networkSnr: c.networkSnr,
    falseAlarmRatePerYear: c.falseAlarmRatePerYear,
    detectors: c.detectors,
    chirpMassDetectorFrame: c.chirpMassDetectorFrame,
    chirpMassDetectorFrameSd: sd,
    classes:
      pBns === null || pNsbh === null || pBbh === null || pLowerGap === null
        ? null
        : { bns: pBns, nsbh: pNsbh, bbh: pBbh, lowerGap: pLowerGap },
    coalescenceTimeS: typeof tc === "number" ? tc : null,
    pAstro: typeof pAstro === "number" ? pAstro : null,
    chirpModel: typeof chirpModel === "string" ? chirpModel : null,
    chirpReducedChiSquare: typeof chirpChi === "number" ? chirpChi : null,
    chirpMassError: typeof chirpMassError === "string" ? chirpMassError : null,
    liveTaskCount: Number(n ?? 0),
    triggerCount: c.triggerCount,
  }));
  return {
    cards,
    // The one acknowledgement deadline (paging + acknowledgement step, from receipt) drives the card's alarm.
    deadlines: boardAckDeadlines(deadlines),
    serverNow: now.getTime(),
    windowDays: BOARD_WINDOW_DAYS,
  };
}

/** One row of the candidate list: the card's headline fields plus the dominant class. */
export type CandidateListRow = Pick<
  BoardCard,
  | "id"
  | "externalId"
  | "source"
  | "revision"
  | "stage"
  | "triageState"
  | "eventTime"
  | "receivedAt"
  | "falseAlarmRatePerYear"
  | "networkSnr"
  | "chirpMassDetectorFrame"
  | "detectors"
  | "owner"
> & { dominantClass: SourceClass | null };

export interface CandidateListPage {
  rows: CandidateListRow[];
  total: number;
  page: number;
  pageSize: number;
}

const sortColumns: Record<CandidateSortKey, SQL> = {
  receivedAt: sql`${candidates.receivedAt}`,
  eventTime: sql`${candidates.eventTime}`,
  falseAlarmRatePerYear: sql`${candidates.falseAlarmRatePerYear}`,
  networkSnr: sql`${candidates.networkSnr}`,
  chirpMassDetectorFrame: sql`${candidates.chirpMassDetectorFrame}`,
  externalId: sql`${candidates.externalId}`,
  triageState: sql`${candidates.triageState}`,
};

/** The candidate list: filter, sort (nulls last) and one page, with the total for the pager. */
export async function listCandidates(query: CandidateListQuery): Promise<CandidateListPage> {
  const db = await getDb();
  // A candidate merged into another has no triggers of its own left: it leaves the lists.
  const where: SQL[] = [isNull(candidates.mergedIntoId)];
  if (query.state.length) where.push(inArray(candidates.triageState, query.state));
  if (query.stage.length) where.push(inArray(candidates.stage, query.stage));
  if (query.class.length) where.push(inArray(candidates.dominantClass, query.class));
  if (query.q) {
    where.push(
      // Any of its triggers' ids finds a candidate, not only the preferred one's (a pipeline quotes its own id).
      or(
        eq(candidates.id, query.q),
        sql`instr(lower(${candidates.externalId}), lower(${query.q})) > 0`,
        sql`exists (select 1 from triggers t where t.candidate_id = ${candidates.id} and instr(lower(t.external_id), lower(${query.q})) > 0)`,
      ) as SQL,
    );
  }
  const condition = and(...where);
  const column = sortColumns[query.sort];
  const direction = query.dir === "asc" ? sql`asc` : sql`desc`;
  const pageRows = (page: number) =>
    db
      .select({ c: candidates, owner: { id: users.id, name: users.name, initials: users.initials } })
      .from(candidates)
      .leftJoin(users, eq(users.id, candidates.ownerId))
      .where(condition)
      .orderBy(sql`${column} is null`, sql`${column} ${direction}`, desc(candidates.receivedAt))
      .limit(query.pageSize)
      .offset((page - 1) * query.pageSize);
  const [firstRows, [totalRow]] = await Promise.all([pageRows(query.page), db.select({ n: count() }).from(candidates).where(condition)]);
  const total = totalRow?.n ?? 0;
  // A page past the last one (an old bookmark, ?page=999) is the last page, said as such in `page`.
  const lastPage = Math.max(1, Math.ceil(total / query.pageSize));
  const page = Math.min(query.page, lastPage);
  const rows = page === query.page ? firstRows : await pageRows(page);
  return {
    rows: rows.map(({ c, owner }) => ({
      id: c.id,
      externalId: c.externalId,
      source: c.source,
      revision: c.currentRevision,
      stage: c.stage,
      triageState: c.triageState,
      eventTime: c.eventTime.getTime(),
      receivedAt: c.receivedAt.getTime(),
      falseAlarmRatePerYear: c.falseAlarmRatePerYear,
      networkSnr: c.networkSnr,
      chirpMassDetectorFrame: c.chirpMassDetectorFrame,
      dominantClass: c.dominantClass,
      detectors: c.detectors,
      owner: owner?.id ? owner : null,
    })),
    total,
    page,
    pageSize: query.pageSize,
  };
}

export interface NoteView {
  id: string;
  body: string;
  createdAt: number;
  author: PersonRef;
}

export async function listNotes(candidateId: string): Promise<NoteView[]> {
  const db = await getDb();
  const rows = await db
    .select({ note: candidateNotes, author: { id: users.id, name: users.name, initials: users.initials } })
    .from(candidateNotes)
    .innerJoin(users, eq(users.id, candidateNotes.authorId))
    .where(eq(candidateNotes.candidateId, candidateId))
    .orderBy(asc(candidateNotes.createdAt));
  return rows.map(({ note, author }) => ({ id: note.id, body: note.body, createdAt: note.createdAt.getTime(), author }));
}

/** Adds a note to a candidate's thread, with its audit event. */
export async function addNote(actor: SessionUser, candidateId: string, body: string, now = new Date()): Promise<NoteView> {
  const db = await getDb();
  return db.transaction(async (tx) => {
      const [candidate] = await tx.select({ id: candidates.id }).from(candidates).where(eq(candidates.id, candidateId));
      if (!candidate) throw new ApiError(404, "candidate not found");
      const [note] = await tx.insert(candidateNotes).values({ candidateId, authorId: actor.id, body, createdAt: now }).returning();
      if (!note) throw new Error("note insert returned nothing");
      await appendEvent(tx, { at: now, kind: eventKinds.candidateNoteAdded, actorId: actor.id, candidateId, data: { noteId: note.id } });
      return {
        id: note.id,
        body: note.body,
        createdAt: note.createdAt.getTime(),
        author: { id: actor.id, name: actor.name, initials: actor.initials },
      };
    });
}

export interface AuditEntry {
  id: number;
  at: number;
  kind: string;
  actor: PersonRef | null;
  taskId: string | null;
  fromState: string | null;
  toState: string | null;
  data: Record<string, unknown> | null;
}

/** A candidate's audit log, oldest first, with the people who acted. */
export async function listCandidateAudit(candidateId: string, limit = 500): Promise<AuditEntry[]> {
  const db = await getDb();
  const rows = await db
    .select({ e: events, actor: { id: users.id, name: users.name, initials: users.initials } })
    .from(events)
    .leftJoin(users, eq(users.id, events.actorId))
    .where(eq(events.candidateId, candidateId))
    .orderBy(asc(events.id))
    .limit(limit);
  return rows.map(({ e, actor }) => ({
    id: e.id,
    at: e.at.getTime(),
    kind: e.kind,
    actor: actor?.id ? actor : null,
    taskId: e.taskId,
    fromState: e.fromState,
    toState: e.toState,
    data: e.data,
  }));
}

/** Names for user ids mentioned in event data (e.g. a new owner), in one query. */
export async function loadPeople(ids: Array<string | null | undefined>): Promise<Map<string, PersonRef>> {
  const wanted = [...new Set(ids.filter((id): id is string => Boolean(id)))];
  if (wanted.length === 0) return new Map();
  const db = await getDb();
  const rows = await db.select({ id: users.id, name: users.name, initials: users.initials }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((row) => [row.id, row]));
}
