import { getDb } from "@/db";
import type { Footprint, Instrument, NewObservation, ObservationSource } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { findInstrumentsByIds, instrumentsAtSite, insertObservations, readTaskForRecording, sitesObservedBy, type TaskForRecording } from "@/lib/data/observations";
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
