import { getDb, type Tx } from "@/db";
import type { Footprint, Instrument, NewObservation, ObservationSource, Plan, PlanPointing } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import {
  deleteTickObservations,
  findInstrumentsByIds,
  instrumentsAtSite,
  insertObservations,
  readTaskForRecording,
  sitesObservedBy,
  type TaskForRecording,
} from "@/lib/data/observations";
import { eventKinds } from "@/lib/events/kinds";
import { checkObservationRows, type ObservationRow, type RowProblem } from "@/lib/validations/observations";
import { parseObservationCsv } from "@/lib/validations/observations-csv";

export interface RecordedObservations {
  accepted: number;
  ids: string[];
}

/** A refused row as the API answers it: 422 naming the row and the field. */
export function rowRefusal(problem: RowProblem, status = 422): ApiError {
  const where = problem.row > 0 ? `row ${problem.row}, ${problem.field}` : problem.field;
  return new ApiError(status, `${where}: ${problem.message}`, { row: problem.row, field: problem.field, issues: [{ path: where, message: problem.message }] });
}

/**
 * Records a task's observation log: every row checked (shape, time, instrument, footprint, who may) before one
 * transaction inserts them all with one audit event, so a refused request stores nothing. The footprint defaults
 * to the instrument's, the instrument to the task's (its site's only instrument). Observers record for tasks they
 * hold, or with their own sites' instruments; shifters and coordinators for any (the route lets no one else in).
 */
export async function recordObservations(
  actor: SessionUser,
  taskId: string,
  input: readonly unknown[],
  options: { now: Date; via: ObservationSource },
): Promise<RecordedObservations> {
  const checked = checkObservationRows(input, options.now);
  if (!checked.ok) throw rowRefusal(checked.problem);
  const db = await getDb();
  return db.transaction(async (tx) => {
    const task = await readTaskForRecording(tx, taskId);
    if (!task) throw new ApiError(404, "task not found");
    const named = [...new Set(checked.rows.map((r) => r.instrumentId).filter((id): id is string => id !== undefined))];
    const known = new Map((await findInstrumentsByIds(tx, named)).map((i) => [i.id, i]));
    const siteInstruments = task.siteId && checked.rows.some((r) => !r.instrumentId) ? await instrumentsAtSite(tx, task.siteId) : [];
    const mustOwnInstrument = actor.role === "observer" && task.claimedById !== actor.id;
    const mySites = mustOwnInstrument ? new Set(await sitesObservedBy(tx, actor.id)) : null;

    const rows: NewObservation[] = checked.rows.map((row, index) => {
      const instrument = resolveInstrument(row, index + 1, task, known, siteInstruments);
      if (mySites && !(instrument && mySites.has(instrument.siteId))) {
        throw rowRefusal(
          { row: index + 1, field: "instrumentId", message: "you do not hold this task, so name an instrument of one of your own sites (or claim the task)" },
          403,
        );
      }
      const footprint: Footprint | undefined = row.footprint ?? instrument?.footprint;
      if (!footprint) throw rowRefusal({ row: index + 1, field: "instrumentId", message: noFootprintMessage(task, siteInstruments.length) });
      return {
        candidateId: task.candidateId,
        taskId: task.id,
        instrumentId: instrument?.id ?? null,
        siteId: instrument?.siteId ?? task.siteId,
        raDeg: row.raDeg,
        decDeg: row.decDeg,
        footprint,
        startTime: new Date(row.startTime),
        exposureS: row.exposureS,
        filter: row.filter,
        limitingMagnitude: row.limitingMagnitude ?? instrument?.limitingMag ?? null,
        pointingIndex: row.pointingIndex ?? null,
        source: options.via,
        recordedById: actor.id,
        createdAt: options.now,
      };
    });
    const ids = await insertObservations(tx, rows);
    await appendEvent(tx, {
      at: options.now,
      kind: eventKinds.observationsRecorded,
      actorId: actor.id,
      candidateId: task.candidateId,
      taskId: task.id,
      data: { count: ids.length, via: options.via, siteIds: [...new Set(rows.map((r) => r.siteId ?? null))] },
    });
    return { accepted: ids.length, ids };
  });
}

/** The same log as an uploaded CSV file (our columns, header row): a bad header or row refuses the whole file. */
export async function recordObservationCsv(actor: SessionUser, taskId: string, text: string, options: { now: Date }): Promise<RecordedObservations> {
  const parsed = parseObservationCsv(text);
  if (!parsed.ok) throw rowRefusal(parsed.problem);
  return recordObservations(actor, taskId, parsed.rows, { now: options.now, via: "csv" });
}

/** The row's instrument, else the task's site's only one; null when neither names one (a footprint must then be given). */
function resolveInstrument(
  row: ObservationRow,
  rowNumber: number,
  task: TaskForRecording,
  known: Map<string, Instrument>,
  siteInstruments: Instrument[],
): Instrument | null {
  if (row.instrumentId === undefined) return siteInstruments.length === 1 ? (siteInstruments[0] ?? null) : null;
  const instrument = known.get(row.instrumentId);
  if (!instrument) throw rowRefusal({ row: rowNumber, field: "instrumentId", message: `no instrument ${row.instrumentId}` });
  if (task.siteId && instrument.siteId !== task.siteId) {
    throw rowRefusal({ row: rowNumber, field: "instrumentId", message: `instrument ${instrument.name} is not at this task's site` });
  }
  return instrument;
}

function noFootprintMessage(task: TaskForRecording, siteInstrumentCount: number): string {
  if (!task.siteId) return "the task names no site: give instrumentId or a footprint";
  if (siteInstrumentCount === 0) return "the task's site has no instrument: give a footprint";
  return `the task's site has ${siteInstrumentCount} instruments: name one (instrumentId) or give a footprint`;
}

/** A ticked planned pointing: its plan's instrument defaults and the tile's position. */
export interface TickedTile {
  candidateId: string;
  taskId: string | null;
  plan: Pick<Plan, "id" | "instrumentId" | "siteId" | "footprint" | "exposureS" | "filter">;
  pointing: Pick<PlanPointing, "index" | "raDeg" | "decDeg">;
}

/**
 * The exposure a tick stands for, inside the tick's transaction: at the planned position with the plan's footprint,
 * exposure and filter (else the instrument's first) and the instrument's limiting magnitude, ending at the tick
 * (a tick says the exposure is done). The tick's own rules decided who may; one audit event, via "tick".
 */
export async function recordTickedPointing(tx: Tx, actor: SessionUser, tile: TickedTile, now: Date): Promise<string> {
  const { plan, pointing } = tile;
  const [instrument] = plan.instrumentId ? await findInstrumentsByIds(tx, [plan.instrumentId]) : [];
  const [id] = await insertObservations(tx, [
    {
      candidateId: tile.candidateId,
      taskId: tile.taskId,
      instrumentId: plan.instrumentId,
      siteId: plan.siteId,
      raDeg: pointing.raDeg,
      decDeg: pointing.decDeg,
      footprint: plan.footprint,
      startTime: new Date(now.getTime() - plan.exposureS * 1000),
      exposureS: plan.exposureS,
      filter: plan.filter ?? instrument?.filters[0] ?? "unfiltered",
      limitingMagnitude: instrument?.limitingMag ?? null,
      pointingIndex: pointing.index,
      source: "tick",
      recordedById: actor.id,
      createdAt: now,
    },
  ]);
  if (!id) throw new Error("tick observation insert returned no id");
  await appendEvent(tx, {
    at: now,
    kind: eventKinds.observationsRecorded,
    actorId: actor.id,
    candidateId: tile.candidateId,
    taskId: tile.taskId,
    data: { count: 1, via: "tick", siteIds: [plan.siteId], planId: plan.id, pointingIndex: pointing.index },
  });
  return id;
}

/** A tick taken back takes back the exposure it recorded (and audits that); a typed-in observation stays. */
export async function withdrawTickedPointing(tx: Tx, actor: SessionUser, tile: TickedTile, now: Date): Promise<number> {
  const removed = await deleteTickObservations(tx, { candidateId: tile.candidateId, pointingIndex: tile.pointing.index, raDeg: tile.pointing.raDeg, decDeg: tile.pointing.decDeg });
  if (removed > 0) {
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.observationsWithdrawn,
      actorId: actor.id,
      candidateId: tile.candidateId,
      taskId: tile.taskId,
      data: { count: removed, via: "tick", planId: tile.plan.id, pointingIndex: tile.pointing.index },
    });
  }
  return removed;
}
