import type { Tx } from "@/db";
import { appendEvent } from "@/lib/data/events";
import { activeObservers } from "@/lib/data/paging-people";
import { tasksWithSiteCodes } from "@/lib/data/tasks";
import { eventKinds } from "@/lib/events/kinds";
import { notifyNow } from "./clock";
import { cancelCandidatePaging, queueNotifications } from "./outbox";
import type { CandidateSummary } from "./content";
import { pageNewCandidate, readCandidateSummary } from "./plan";
import { readPreferencesMany } from "./preferences";
import { joinPagesLouder, type HeadlineForPaging } from "./repage";
import { taskListenersBySite } from "./recipients";
import { taskLine } from "./task-copy";

/**
 * Where other areas tell paging that something happened, inside their own transaction, so the outbox rows
 * commit or roll back with the event that caused them. The paging area owns the bodies of these functions.
 */
export interface CandidateIngested {
  candidateId: string;
  eventId: number;
  revision: number;
  stage: string;
  falseAlarmRatePerYear: number;
  isNewCandidate: boolean;
  receivedAt: Date;
  /** the candidate's headline as just written, when the caller has it (saves paging a read) */
  candidate?: CandidateSummary;
}

/** A new candidate pages the on-call primary and arms escalation; a withdrawal stops whatever is still waiting. */
export async function onCandidateIngested(tx: Tx, info: CandidateIngested): Promise<void> {
  const now = notifyNow();
  if (info.isNewCandidate) await pageNewCandidate(tx, info, now);
  else if (info.stage === "withdrawn") await cancelCandidatePaging(tx, info.candidateId, "withdrawn by the feed", now);
}

export interface TriggerJoined {
  candidateId: string;
  /** the trigger-joined event */
  eventId: number;
  receivedAt: Date;
  /** the candidate's triage state: once someone has taken it, nobody is paged again */
  triageState: string;
  before: HeadlineForPaging;
  after: HeadlineForPaging;
}

/**
 * A trigger joined a candidate that was already paged about: page again only by the re-page rule of
 * lib/notify/repage.ts (the ladder would now reach people more loudly), and only while the candidate is still new.
 * Answers whether it paged.
 */
export async function onTriggerJoined(tx: Tx, info: TriggerJoined): Promise<boolean> {
  if (info.triageState !== "new") return false;
  const now = notifyNow();
  if (!(await joinPagesLouder(tx, info.before, info.after, info.receivedAt, now))) return false;
  await pageNewCandidate(tx, { candidateId: info.candidateId, eventId: info.eventId, receivedAt: info.receivedAt, ...info.after }, now);
  return true;
}

/** A candidate merged into another stops paging on its own: the candidate it joined speaks for the signal. */
export async function onCandidateMerged(tx: Tx, info: { fromCandidateId: string; at: Date }): Promise<void> {
  await cancelCandidatePaging(tx, info.fromCandidateId, "merged into another candidate", info.at);
}

export interface TasksCancelled {
  candidateId: string;
  eventId: number;
  /** owners of tasks that were claimed or being observed */
  ownerIds: string[];
  taskIds: string[];
  reason: string;
}

/** Tells each owner their task was cancelled (in the app, and by push/e-mail as their task switches say). */
export async function onTasksCancelled(tx: Tx, info: TasksCancelled): Promise<void> {
  if (info.ownerIds.length === 0) return;
  const now = notifyNow();
  const candidate = await readCandidateSummary(tx, info.candidateId);
  const name = candidate?.externalId ?? "a candidate";
  const text = { title: `Follow-up of ${name} cancelled`, body: `Your task was cancelled: ${info.reason}. No observation is needed.` };
  const spec: TaskSpec = {
    eventId: info.eventId,
    kind: "task-cancelled",
    ...text,
    path: "/follow-up",
    candidateId: info.candidateId,
    taskId: info.taskIds.length === 1 ? (info.taskIds[0] ?? null) : null,
    now,
  };
  await queueTaskMessages(tx, info.ownerIds.map((userId) => ({ userId, spec })));
}

export interface TasksCreated {
  candidateId: string;
  /** the event that created the tasks (one event may create several) */
  eventId: number;
  taskIds: string[];
}

/** Tells observers about new follow-up tasks at the sites they listen to (preferences, else their sites). */
export async function onTasksCreated(tx: Tx, info: TasksCreated): Promise<void> {
  if (info.taskIds.length === 0) return;
  const now = notifyNow();
  const tasks = await tasksWithSiteCodes(tx, info.candidateId, info.taskIds);
  const bySite = await taskListenersBySite(tx, [...new Set(tasks.flatMap((t) => (t.siteId ? [t.siteId] : [])))]);
  // A task any site may take reaches every observer.
  const everyObserver = tasks.some((t) => t.siteId === null) ? await activeObservers(tx) : [];
  const perUser = new Map<string, string[]>();
  for (const task of tasks) {
    for (const userId of task.siteId ? (bySite.get(task.siteId) ?? []) : everyObserver) {
      perUser.set(userId, [...(perUser.get(userId) ?? []), taskLine(task, now)]);
    }
  }
  if (perUser.size === 0) return;
  const candidate = await readCandidateSummary(tx, info.candidateId);
  const claimPath = candidate ? `/follow-up?candidate=${encodeURIComponent(candidate.externalId)}` : "/follow-up";
  await queueTaskMessages(
    tx,
    [...perUser].map(([userId, items]) => ({
      userId,
      spec: {
        eventId: info.eventId,
        kind: "task-created",
        title: `Follow-up wanted for ${candidate?.externalId ?? "a candidate"}`,
        body: `New task${items.length > 1 ? "s" : ""}:\n${items.map((line) => `• ${line}`).join("\n")}\nClaim ${items.length > 1 ? "one" : "it"} on the follow-up board.`,
        path: claimPath,
        candidateId: info.candidateId,
        taskId: tasks.length === 1 ? (tasks[0]?.id ?? null) : null,
        now,
      },
    })),
  );
  await appendEvent(tx, {
    at: now,
    kind: eventKinds.pageQueued,
    candidateId: info.candidateId,
    data: { userIds: [...perUser.keys()], channels: ["in-app", "push", "email"], reason: "task-created" },
  });
}

type TaskSpec = Omit<Parameters<typeof queueNotifications>[1], "channels" | "ackable" | "onCall">;

/** Task messages: in-app always; push and e-mail as each person's task switches say (read once for all). */
async function queueTaskMessages(tx: Tx, messages: Array<{ userId: string; spec: TaskSpec }>): Promise<void> {
  const prefs = await readPreferencesMany(tx, messages.map((m) => m.userId));
  for (const { userId, spec } of messages) {
    const p = prefs.get(userId);
    const channels = (["push", "email"] as const).filter((c) => p?.taskChannels[c] !== false);
    await queueNotifications(tx, { ...spec, channels }, [userId]);
  }
}

export interface CandidateAcknowledged {
  candidateId: string;
  userId: string;
  at: Date;
}

/** Stops escalation at once, whichever channel the acknowledgement came from: pending timers and unsent pages. */
export async function onCandidateAcknowledged(tx: Tx, info: CandidateAcknowledged): Promise<void> {
  await cancelCandidatePaging(tx, info.candidateId, "acknowledged", info.at);
}
