/** The planning clock: "now" for the 7-day bound on task windows. Routes read it; tests set it, so no refusal hangs on the wall clock. */
let clock: () => number = Date.now;

export function planningNow(): Date {
  return new Date(clock());
}

/** Replaces the clock; `null` restores the wall clock. */
export function setPlanningClock(next: (() => number) | null): void {
  clock = next ?? Date.now;
}
