/** The review's clock ("now" for open steps). Routes and pages read it; tests set it, so no figure hangs on the wall clock. */
let clock: () => number = Date.now;

export function reviewNowMs(): number {
  return clock();
}

/** Replaces the clock; `null` restores the wall clock. */
export function setReviewClock(next: (() => number) | null): void {
  clock = next ?? Date.now;
}
