import { loggableMessage } from "@/db/loggable-error";
import { queueDueHandoffs } from "@/lib/services/queue-handoffs";

/** End-of-shift handoffs are queued by a service (lib/services/queue-handoffs.ts); the worker calls this each cycle. */
export async function queueHandoffs(now: Date, log: (m: string) => void): Promise<void> {
  try {
    await queueDueHandoffs(now);
  } catch (error) {
    log(`queueDueHandoffs failed: ${loggableMessage(error)}`);
  }
}
