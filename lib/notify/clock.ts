/**
 * The paging hooks' clock. Hooks run inside other areas' transactions and get no `now` of their own, so tests
 * that drive ingest with an injected clock set this one to match.
 */
let clock: () => number = Date.now;

export function notifyNow(): Date {
  return new Date(clock());
}

/** Replaces the clock; `null` restores the wall clock. */
export function setNotifyClock(next: (() => number) | null): void {
  clock = next ?? Date.now;
}
