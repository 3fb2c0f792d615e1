/**
 * A separate process with its own libSQL client on the same database file: the parent sends { nowMs } to two of
 * these at once; each answers what queueDueHandoffs did.
 */
import { closeDb, getDb } from "@/db";
import { queueDueHandoffs } from "@/lib/services/queue-handoffs";

await getDb();
process.send?.({ ready: true });

process.on("message", async (message: { nowMs: number } | "exit") => {
  if (message === "exit") {
    await closeDb();
    process.exit(0);
  }
  try {
    process.send?.({ ok: true, result: await queueDueHandoffs(new Date(message.nowMs)) });
  } catch (error) {
    process.send?.({ ok: false, error: String(error) });
  }
});
