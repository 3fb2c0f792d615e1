"use client";

import { useSyncExternalStore } from "react";

/** Server clock minus browser clock, so timers tick from server timestamps even on a skewed laptop. */
let offsetMs = 0;
let now = 0;
let timer: ReturnType<typeof setInterval> | undefined;
const listeners = new Set<() => void>();

export function setServerNow(serverNowMs: number): void {
  offsetMs = serverNowMs - Date.now();
}

function tick() {
  now = Date.now() + offsetMs;
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  if (!timer) {
    now = Date.now() + offsetMs;
    timer = setInterval(tick, 1000);
  }
  return () => {
    listeners.delete(listener);
    if (listeners.size === 0) {
      clearInterval(timer);
      timer = undefined;
    }
  };
}

/**
 * The server-corrected time, re-rendering the caller once a second through one shared interval.
 * null during server rendering and hydration, so no clock text is rendered twice differently.
 */
export function useNow(): number | null {
  return useSyncExternalStore(
    subscribe,
    () => now || null,
    () => null,
  );
}
