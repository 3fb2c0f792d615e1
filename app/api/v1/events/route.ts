import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { latestEventId, listEventsAfter } from "@/lib/data/events";
import { config } from "@/lib/env";
import { mayReceive } from "@/lib/events/audience";
import { createEventStream, resumePoint, toWireEvent } from "@/lib/triage/event-stream";

export const dynamic = "force-dynamic";

/**
 * The live event log. As `text/event-stream` (default): every event after the resume point (Last-Event-ID or
 * `?after=`; without either, from now), then new ones as they are written, with heartbeats.
 * With `?mode=poll`: one JSON page `{ events, lastId }`, the fallback when a stream cannot stay open.
 */
export const GET = handler({ roles: can.read }, async ({ req, user }) => {
  const after = resumePoint(req.headers, req.nextUrl.searchParams);
  if (req.nextUrl.searchParams.get("mode") === "poll") {
    if (after === null) return { events: [], lastId: await latestEventId() };
    const read = await listEventsAfter(after, 500);
    const events = read.filter((e) => mayReceive(user, e)).map(toWireEvent);
    return { events, lastId: read.at(-1)?.id ?? after };
  }
  const stream = createEventStream({
    afterId: after ?? (await latestEventId()),
    signal: req.signal,
    readEventsAfter: listEventsAfter,
    visible: (event) => mayReceive(user, event),
    pollMs: config().EVENT_STREAM_POLL_MS,
  });
  return new Response(stream, {
    headers: {
      "Content-Type": "text/event-stream; charset=utf-8",
      // no-transform keeps compression from buffering the stream
      "Cache-Control": "no-cache, no-transform",
      "X-Accel-Buffering": "no",
    },
  });
});
