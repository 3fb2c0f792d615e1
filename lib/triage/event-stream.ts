import { loggableError } from "@/db/loggable-error";
import type { AppEvent } from "@/db/schema";

/** An event as the stream and the polling fallback send it: times in epoch milliseconds. */
export interface WireEvent {
  id: number;
  kind: string;
  at: number;
  actorId: string | null;
  candidateId: string | null;
  taskId: string | null;
  fromState: string | null;
  toState: string | null;
  data: Record<string, unknown> | null;
}

export function toWireEvent(e: AppEvent): WireEvent {
  return {
    id: e.id,
    kind: e.kind,
    at: e.at.getTime(),
    actorId: e.actorId,
    candidateId: e.candidateId,
    taskId: e.taskId,
    fromState: e.fromState,
    toState: e.toState,
    data: e.data,
  };
}

export interface EventStreamOptions {
  /** send events with id greater than this */
  afterId: number;
  /** aborted when the client goes away */
  signal: AbortSignal;
  readEventsAfter: (afterId: number, limit: number) => Promise<AppEvent[]>;
  /** how often the events table is polled; several app processes share it, so polling is the notification */
  pollMs?: number;
  /** a comment line this often keeps proxies from closing an idle stream */
  heartbeatMs?: number;
  batchSize?: number;
  /** how long a browser waits before reconnecting after a drop */
  retryMs?: number;
  /** events the reader may not see are skipped (the cursor still moves past them) */
  visible?: (event: AppEvent) => boolean;
}

const encoder = new TextEncoder();

/** One SSE frame: `id:` is the event id, the resume point a reconnecting EventSource sends as Last-Event-ID. */
export function sseFrame(event: WireEvent): string {
  return `id: ${event.id}\ndata: ${JSON.stringify(event)}\n\n`;
}

/**
 * A text/event-stream body that follows the event log from `afterId`: polls, sends each new event once in id order,
 * sends heartbeats, and stops reading the database as soon as the client disconnects.
 */
export function createEventStream(options: EventStreamOptions): ReadableStream<Uint8Array> {
  const pollMs = options.pollMs ?? 750;
  const heartbeatMs = options.heartbeatMs ?? 15_000;
  const batchSize = options.batchSize ?? 200;
  let closed = false;
  let wake: (() => void) | null = null;
  const stop = () => {
    closed = true;
    wake?.();
  };
  const sleep = (ms: number) =>
    new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, ms);
      wake = () => {
        clearTimeout(timer);
        resolve();
      };
    });

  return new ReadableStream<Uint8Array>({
    start(controller) {
      if (options.signal.aborted) {
        controller.close();
        return;
      }
      options.signal.addEventListener("abort", stop, { once: true });
      const write = (text: string) => {
        if (!closed) controller.enqueue(encoder.encode(text));
      };
      write(`retry: ${options.retryMs ?? 3000}\n: stream from event ${options.afterId}\n\n`);
      void (async () => {
        let last = options.afterId;
        let lastWriteAt = Date.now();
        try {
          while (!closed) {
            const batch = await options.readEventsAfter(last, batchSize);
            if (closed) break;
            for (const event of batch) {
              last = event.id;
              if (options.visible && !options.visible(event)) continue;
              write(sseFrame(toWireEvent(event)));
              lastWriteAt = Date.now();
            }
            if (batch.length === batchSize) continue;
            if (Date.now() - lastWriteAt >= heartbeatMs) {
              write(`: keep-alive ${new Date().toISOString()}\n\n`);
              lastWriteAt = Date.now();
            }
            await sleep(pollMs);
          }
        } catch (error) {
          if (!closed) {
            console.error("[chirpdesk] event stream failed; the client will reconnect", loggableError(error));
            write(": stream error; reconnect\n\n");
          }
        } finally {
          options.signal.removeEventListener("abort", stop);
          closed = true;
          try {
            controller.close();
          } catch {
            // already closed by a cancel
          }
        }
      })();
    },
    cancel() {
      stop();
    },
  });
}

/** Reads the resume point: the Last-Event-ID header (a reconnecting EventSource), else `?after=`, else null. */
export function resumePoint(headers: Headers, searchParams: URLSearchParams): number | null {
  for (const raw of [headers.get("last-event-id"), searchParams.get("after")]) {
    // At most 15 digits: an event id is a safe integer, and a longer run of digits would read as Infinity.
    if (raw !== null && /^\d{1,15}$/.test(raw.trim())) return Number(raw.trim());
  }
  return null;
}
