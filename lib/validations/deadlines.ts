// Pure and import-free: storage (the board), the review and the browser form all read the deadline from here.

/**
 * The acknowledgement deadline, in minutes from receipt: the paging step's allowance plus the acknowledgement
 * step's (by default 1 + 4 = 5 min). The one definition: the board's card turns "Overdue" at it, and the review
 * counts an acknowledgement late past it (receipt → acknowledged) and shows it as the acknowledgement's deadline.
 */
export function acknowledgeDeadlineMinutes(d: { pageMinutes: number; acknowledgeStepMinutes: number }): number {
  return d.pageMinutes + d.acknowledgeStepMinutes;
}

/** The board's card timers: amber at the warning (never after the deadline), red ("Overdue") at the deadline. */
export function boardAckDeadlines(d: { pageMinutes: number; acknowledgeStepMinutes: number; acknowledgeWarnMinutes: number }): {
  acknowledgeWarnMinutes: number;
  acknowledgeAlarmMinutes: number;
} {
  const deadline = acknowledgeDeadlineMinutes(d);
  return { acknowledgeWarnMinutes: Math.min(d.acknowledgeWarnMinutes, deadline), acknowledgeAlarmMinutes: deadline };
}
