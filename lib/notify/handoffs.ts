import { loggableMessage } from "@/db/loggable-error";
import { queueDueHandoffs } from "@/lib/review/handoff";

/** End-of-shift handoffs are the review area's (lib/review/handoff.ts); the worker calls this each cycle. */
export async function queueHandoffs(now: Date, log: (m: string) => void): Promise<void> {
  try {
    await queueDueHandoffs(now);
  } catch (error) {
    log(`queueDueHandoffs failed: ${loggableMessage(error)}`);
  }
}
