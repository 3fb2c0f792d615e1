/**
 * Every kind of entry in the append-only event log (`events` table), in one place, so the live stream,
 * the audit views and the response-time review all read the same names.
 * `fromState`/`toState` columns carry state changes; `data` stays small (ids, numbers, short strings).
 */
export const eventKinds = {
  candidateCreated: "candidate.created", // data: { revision, stage }
  candidateRevised: "candidate.revised", // data: { revision, stage, previousRevision }
  candidateRevisionStale: "candidate.revision-stale", // data: { revision, current }
  candidateWithdrawn: "candidate.withdrawn", // data: { revision }
  triggerJoined: "candidate.trigger-joined", // data: { triggerId, source, externalId, revision, triggerCount }
  preferredChanged: "candidate.preferred-changed", // data: { fromTriggerId, toTriggerId, source, externalId, reason }
  triggerSplit: "candidate.trigger-split", // data: { triggerId, fromCandidateId, toCandidateId } (on both candidates)
  candidatesMerged: "candidate.merged", // data: { fromCandidateId, intoCandidateId, triggerIds } (on both)
  candidateTriaged: "candidate.triaged", // from/to triage state; data: { reason?, via: "board" | "menu" | "card" | "email" | "push" | "api" }
  candidateAssigned: "candidate.assigned", // data: { ownerId, previousOwnerId }
  candidateNoteAdded: "candidate.note-added", // data: { noteId }
  taskCreated: "task.created", // data: { kind, siteId }
  taskStateChanged: "task.state-changed", // from/to task state; data: { claimedById? }
  taskCancelled: "task.cancelled", // from/to; data: { reason }
  taskReported: "task.reported", // data: { reportId }
  pageQueued: "page.queued", // data: { userIds, channels, reason: "new-candidate" | "escalation" | … }
  escalationFired: "escalation.fired", // data: { step, target }
  notificationFailed: "notification.failed", // data: { notificationId, channel, userId }
  pageFailing: "page.failing", // a page still retrying after repeated failures; data: { notificationId, channel, userId, attempts, error, escalatedStep }
  observationsRecorded: "observation.recorded", // data: { count, via: "api" | "csv" | "tick", siteIds }
  observationsWithdrawn: "observation.withdrawn", // a tick taken back; data: { count, via: "tick", planId, pointingIndex }
  counterpartReported: "counterpart.reported", // data: { counterpartId, name, raDeg, decDeg }
  skymapUploaded: "skymap.uploaded", // data: { skymapId, area90Deg2 }
  reportFilesAttached: "task.report-files-attached", // data: { reportId, uploadIds }
  siteChanged: "site.changed", // data: { siteId, code, action: "created" | "updated" | "deleted" }; created: after (the fields); updated: changed, before, after
  instrumentChanged: "instrument.changed", // data: { instrumentId, siteId, name, action: "created" | "updated" | "deleted" }
  planCreated: "plan.created", // data: { planId, siteId, instrumentId, taskId, pointings, scheduled, scheduledProbability }
  pointingDone: "plan.pointing-done", // data: { planId, pointingId, index, done: boolean }
  catalogueChanged: "catalogue.changed", // data: { catalogueId, name, rows?, action: "imported" | "renamed" | "made-default" | "deleted" }
  shiftChanged: "shift.changed", // data: { shiftId, action: "created" | "updated" | "deleted" }
  settingsChanged: "settings.changed", // data: { key }
  userChanged: "user.changed", // data: { userId, action }
} as const;

export type EventKind = (typeof eventKinds)[keyof typeof eventKinds];
