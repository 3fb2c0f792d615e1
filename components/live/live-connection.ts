"use client";

import type { WireEvent } from "@/lib/triage/event-stream";
import { publishLiveEvent, setLiveStatus } from "./live-store";

/** After this many failed reconnects in a row the stream gives way to polling. */
const FAILURES_BEFORE_POLLING = 3;
const POLL_MS = 5_000;
/** While polling, try the stream again this often. */
const STREAM_RETRY_MS = 30_000;

interface Connection {
  users: number;
  stop(): void;
}

let connection: Connection | null = null;

/**
 * One EventSource per tab, shared by every caller (reference-counted). Resumes from the last event it saw, falls
 * back to polling `?mode=poll` when the stream keeps failing, and returns to the stream when it can.
 */
export function acquireLiveConnection(onOpen: () => void): () => void {
  if (!connection) connection = { users: 0, stop: startConnection(onOpen) };
  connection.users += 1;
  return () => {
    if (!connection) return;
    connection.users -= 1;
    if (connection.users === 0) {
      connection.stop();
      connection = null;
    }
  };
}

function startConnection(onOpen: () => void): () => void {
  let source: EventSource | null = null;
  let lastId: number | null = null;
  let failures = 0;
  let stopped = false;
  let pollTimer: ReturnType<typeof setTimeout> | undefined;
  let retryTimer: ReturnType<typeof setTimeout> | undefined;

  const deliver = (event: WireEvent) => {
    if (lastId !== null && event.id <= lastId) return;
    lastId = event.id;
    publishLiveEvent(event);
  };

  const openStream = () => {
    clearTimeout(retryTimer);
    if (stopped) return;
    source = new EventSource(lastId === null ? "/api/v1/events" : `/api/v1/events?after=${lastId}`);
    source.onopen = () => {
      failures = 0;
      clearTimeout(pollTimer);
      setLiveStatus("live");
      onOpen();
    };
    source.onmessage = (message) => {
      try {
        deliver(JSON.parse(message.data) as WireEvent);
      } catch {
        // a malformed frame is skipped; the next one still counts
      }
    };
    source.onerror = () => {
      failures += 1;
      if (source?.readyState === EventSource.CLOSED || failures >= FAILURES_BEFORE_POLLING) fallBackToPolling();
      else setLiveStatus("reconnecting");
    };
  };

  const fallBackToPolling = () => {
    source?.close();
    source = null;
    setLiveStatus("polling");
    void poll();
    retryTimer = setTimeout(() => {
      failures = 0;
      openStream();
    }, STREAM_RETRY_MS);
  };

  const poll = async () => {
    clearTimeout(pollTimer);
    if (stopped || source) return;
    try {
      const res = await fetch(`/api/v1/events?mode=poll${lastId === null ? "" : `&after=${lastId}`}`, { cache: "no-store" });
      if (!res.ok) throw new Error(String(res.status));
      const body = (await res.json()) as { events: WireEvent[]; lastId: number };
      if (lastId === null) lastId = body.lastId;
      for (const event of body.events) deliver(event);
      if (!source) setLiveStatus("polling");
    } catch {
      if (!source) setLiveStatus("offline");
    }
    if (!stopped && !source) pollTimer = setTimeout(() => void poll(), POLL_MS);
  };

  openStream();
  return () => {
    stopped = true;
    clearTimeout(pollTimer);
    clearTimeout(retryTimer);
    source?.close();
    source = null;
  };
}
