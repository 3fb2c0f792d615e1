import { getDb } from "@/db";
import type { Counterpart } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { insertCounterpart, listCounterparts, type CounterpartRow } from "@/lib/data/counterparts";
import { appendEvent } from "@/lib/data/events";
import { listCandidateSkymaps, readSkymapMap } from "@/lib/data/skymaps";
import { readCandidateRow } from "@/lib/data/triggers";
import { OUTSIDE_LEVEL, searchedRegion } from "@/lib/coverage";
import { eventKinds } from "@/lib/events/kinds";
import type { SkymapMap } from "@/lib/skymap";
import { MAX_FUTURE_MS } from "@/lib/validations/observations";
import type { CounterpartBody } from "@/lib/validations/counterparts";

/** A counterpart as the API answers it: the stored row plus its searched region on the candidate's newest map. */
export interface CounterpartAnswer {
  id: string;
  candidateId: string;
  raDeg: number;
  decDeg: number;
  observedAt: string;
  magnitude: number | null;
  magnitudeError: number | null;
  filter: string | null;
  name: string | null;
  notes: string;
  reportedBy: { id: string; name: string } | null;
  createdAt: string;
  /** the map the three numbers below were computed on; all null when the candidate has no sky map */
  skymapId: string | null;
  searchedProbability: number | null;
  searchedAreaDeg2: number | null;
  probabilityDensityPerDeg2: number | null;
  /** set when the position lies outside the 99.9 % credible region (kept anyway), or there is no map to judge by */
  warning: string | null;
}

/** The newest sky map of a candidate, parsed (null when it has none). */
async function newestMap(candidateId: string): Promise<{ id: string; map: SkymapMap } | null> {
  const [skymap] = await listCandidateSkymaps(candidateId);
  return skymap ? { id: skymap.id, map: readSkymapMap(skymap.file.sha256) } : null;
}

function toAnswer(row: Counterpart, reportedBy: CounterpartRow["reportedBy"], on: { id: string; map: SkymapMap } | null): CounterpartAnswer {
  const region = on ? searchedRegion(on.map, row.raDeg, row.decDeg) : null;
  let warning: string | null = null;
  if (!region) warning = "the candidate has no sky map yet, so this position cannot be ranked";
  else if (region.searchedProbability > OUTSIDE_LEVEL) {
    warning = `outside the 99.9 % credible region (searched probability ${region.searchedProbability.toFixed(4)}); kept as reported`;
  }
  return {
    id: row.id,
    candidateId: row.candidateId,
    raDeg: row.raDeg,
    decDeg: row.decDeg,
    observedAt: row.observedAt.toISOString(),
    magnitude: row.magnitude,
    magnitudeError: row.magnitudeError,
    filter: row.filter,
    name: row.name,
    notes: row.notes,
    reportedBy,
    createdAt: row.createdAt.toISOString(),
    skymapId: on?.id ?? null,
    searchedProbability: region?.searchedProbability ?? null,
    searchedAreaDeg2: region?.searchedAreaDeg2 ?? null,
    probabilityDensityPerDeg2: region?.probabilityDensityPerDeg2 ?? null,
    warning,
  };
}

/**
 * Stores a counterpart with its audit event in one transaction, then ranks it on the newest sky map: the
 * searched probability and area (lib/coverage/searched.ts). A position outside the 99.9 % region is kept with a
 * warning. 404 for an unknown candidate; an observation time over 1 h ahead of the server's clock is 422.
 */
export async function reportCounterpart(actor: SessionUser, candidateId: string, body: CounterpartBody, now: Date): Promise<CounterpartAnswer> {
  const observedAt = new Date(body.observedAt);
  if (observedAt.getTime() - now.getTime() > MAX_FUTURE_MS) {
    throw new ApiError(422, "invalid request body: observedAt: more than 1 h in the future", { issues: [{ path: "observedAt", message: "more than 1 h in the future" }] });
  }
  const db = await getDb();
  const row = await db.transaction(async (tx) => {
    if (!(await readCandidateRow(tx, candidateId))) throw new ApiError(404, "candidate not found");
    const stored = await insertCounterpart(tx, {
      candidateId,
      raDeg: body.raDeg,
      decDeg: body.decDeg,
      observedAt,
      magnitude: body.magnitude ?? null,
      magnitudeError: body.magnitudeError ?? null,
      filter: body.filter ?? null,
      name: body.name ?? null,
      notes: body.notes,
      reportedById: actor.id,
      createdAt: now,
    });
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.counterpartReported,
      actorId: actor.id,
      candidateId,
      data: { counterpartId: stored.id, name: stored.name, raDeg: stored.raDeg, decDeg: stored.decDeg },
    });
    return stored;
  });
  return toAnswer(row, { id: actor.id, name: actor.name }, await newestMap(candidateId));
}

/** A candidate's counterparts, each ranked on the newest sky map (a new revision's map re-ranks them all). */
export async function listCandidateCounterparts(candidateId: string): Promise<{ skymapId: string | null; counterparts: CounterpartAnswer[] }> {
  const db = await getDb();
  if (!(await readCandidateRow(db, candidateId))) throw new ApiError(404, "candidate not found");
  const on = await newestMap(candidateId);
  const rows = await listCounterparts(candidateId);
  return { skymapId: on?.id ?? null, counterparts: rows.map(({ reportedBy, ...row }) => toAnswer(row, reportedBy, on)) };
}
