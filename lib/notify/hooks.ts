import type { Tx } from "@/lib/data/events";

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
}

export async function onCandidateIngested(_tx: Tx, _info: CandidateIngested): Promise<void> {
  // Filled in by the paging area (issue 6): page the on-call primary, schedule escalation timers.
}

export interface TasksCancelled {
  candidateId: string;
  eventId: number;
  /** owners of tasks that were claimed or being observed */
  ownerIds: string[];
  taskIds: string[];
  reason: string;
}

export async function onTasksCancelled(_tx: Tx, _info: TasksCancelled): Promise<void> {
  // Filled in by the paging area (issue 6): tell each owner their task was cancelled.
}

export interface CandidateAcknowledged {
  candidateId: string;
  userId: string;
  at: Date;
}

export async function onCandidateAcknowledged(_tx: Tx, _info: CandidateAcknowledged): Promise<void> {
  // Filled in by the paging area (issue 6): stop escalation timers at once.
}
