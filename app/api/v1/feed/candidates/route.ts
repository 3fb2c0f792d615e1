import { handler } from "@/lib/api/handler";
import { maxFeedBodyBytes, receiveFeedPost } from "@/lib/feed/receive-post";

/**
 * A feed answer is never cached, and `no-transform` keeps the server from gzipping it: the answers are a few kB
 * for a machine on the same network, where compressing each one costs the server more than it saves.
 */
const answerHeaders = { "content-type": "application/json", "cache-control": "no-store, no-transform" };

/** Signed by the feed (size 413 → signature 401, nothing kept → JSON, schema, track; refusals kept as dead letters). */
export const POST = handler({ feedSignature: true, maxBodyBytes: maxFeedBodyBytes }, async ({ raw, now }) => {
  const answer = await receiveFeedPost(raw, now);
  return new Response(answer.json, { status: answer.status, headers: answerHeaders });
});
