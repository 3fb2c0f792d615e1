"use client";

import { useEffect, useRef, useSyncExternalStore } from "react";
import type { WireEvent } from "@/lib/triage/event-stream";

/** live: the stream is open; reconnecting: it dropped and the browser retries; polling: the JSON fallback runs. */
export type LiveStatus = "connecting" | "live" | "reconnecting" | "polling" | "offline";

let status: LiveStatus = "connecting";
const statusListeners = new Set<() => void>();
const eventListeners = new Set<(event: WireEvent) => void>();

export function setLiveStatus(next: LiveStatus): void {
  if (next === status) return;
  status = next;
  for (const listener of statusListeners) listener();
}

/** Hands one event from the stream (or the polling fallback) to every subscriber. */
export function publishLiveEvent(event: WireEvent): void {
  for (const listener of eventListeners) listener(event);
}

export function subscribeLiveEvents(listener: (event: WireEvent) => void): () => void {
  eventListeners.add(listener);
  return () => eventListeners.delete(listener);
}

/** The connection state for the header indicator (and anyone else who wants it). */
export function useLiveStatus(): LiveStatus {
  return useSyncExternalStore(
    (onChange) => {
      statusListeners.add(onChange);
      return () => statusListeners.delete(onChange);
    },
    () => status,
    () => "connecting",
  );
}

/** Calls `handler` for every live event while the component is mounted (the latest handler, without resubscribing). */
export function useLiveEvents(handler: (event: WireEvent) => void): void {
  const ref = useRef(handler);
  useEffect(() => {
    ref.current = handler;
  });
  useEffect(() => subscribeLiveEvents((event) => ref.current(event)), []);
}
