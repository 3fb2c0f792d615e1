/** TanStack Query keys of the boards area, named once so live invalidation and the screens agree. */
export const queryKeys = {
  board: ["board"] as const,
  roster: ["roster"] as const,
  tasks: ["tasks"] as const,
  candidates: ["candidates"] as const,
  candidate: (id: string) => ["candidate", id] as const,
  notes: (id: string) => ["notes", id] as const,
  coverage: (id: string) => ["coverage", id] as const,
  observations: (id: string) => ["observations", id] as const,
  counterparts: (id: string) => ["counterparts", id] as const,
  /** a candidate's pointing plans (the task view and the sky map read them under this prefix) */
  plans: (candidateId: string) => ["plans", candidateId] as const,
};

export type QueryKey = readonly unknown[];

interface EventLike {
  kind: string;
  candidateId: string | null;
  taskId: string | null;
}

/** Which queries an event makes stale; unknown kinds touch nothing. */
export function keysForEvent(event: EventLike): QueryKey[] {
  const keys: QueryKey[] = [];
  const candidate = event.candidateId ? [queryKeys.candidate(event.candidateId)] : [];
  if (event.kind === "candidate.note-added") {
    if (event.candidateId) keys.push(queryKeys.notes(event.candidateId));
    return [...keys, ...candidate];
  }
  if (event.kind === "observation.recorded" || event.kind === "observation.withdrawn") {
    // A task's log changed: the candidate's coverage, its drawn footprints and the task cards.
    return event.candidateId
      ? [queryKeys.coverage(event.candidateId), queryKeys.observations(event.candidateId), queryKeys.tasks, ...candidate]
      : [queryKeys.tasks];
  }
  if (event.kind === "counterpart.reported") return event.candidateId ? [queryKeys.counterparts(event.candidateId), ...candidate] : [];
  if (event.kind === "skymap.uploaded") {
    // Coverage and searched regions are computed on the newest map.
    return event.candidateId ? [queryKeys.coverage(event.candidateId), queryKeys.counterparts(event.candidateId), ...candidate] : [];
  }
  if (event.kind.startsWith("candidate.")) {
    // A withdrawal cancels tasks, a revision changes task cards' candidate stage: refresh tasks too.
    keys.push(queryKeys.board, queryKeys.candidates, ...candidate);
    if (event.kind === "candidate.withdrawn" || event.kind === "candidate.revised") keys.push(queryKeys.tasks);
    return keys;
  }
  if (event.kind.startsWith("task.")) return [queryKeys.tasks, queryKeys.board, ...candidate];
  // a plan or a tick changes the task cards' pointing counts and the sky map's footprints
  if (event.kind.startsWith("plan.")) return [queryKeys.tasks, ...(event.candidateId ? [queryKeys.plans(event.candidateId)] : []), ...candidate];
  if (event.kind === "shift.changed" || event.kind === "user.changed") return [queryKeys.roster];
  if (event.kind === "settings.changed") return [queryKeys.board];
  return keys;
}
