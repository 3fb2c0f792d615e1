/**
 * A separate process with its own libSQL client on the same database file, for an honest claim race:
 * the parent sends { taskId, user } to two of these at once; each answers what claimTask did.
 */
import { closeDb, getDb } from "@/db";
import type { SessionUser } from "@/lib/auth/roles";
import { ApiError } from "@/lib/api/errors";
import { claimTask } from "@/lib/services/claim-task";

interface ClaimMessage {
  taskId: string;
  user: SessionUser;
}

await getDb();
process.send?.({ ready: true });

process.on("message", async (message: ClaimMessage | "exit") => {
  if (message === "exit") {
    await closeDb();
    process.exit(0);
  }
  try {
    const task = await claimTask(message.user, message.taskId);
    process.send?.({ taskId: message.taskId, status: 200, claimedById: task.claimedById });
  } catch (error) {
    if (error instanceof ApiError) {
      process.send?.({ taskId: message.taskId, status: error.status, details: error.details ?? null });
    } else {
      process.send?.({ taskId: message.taskId, status: 500, details: { message: String(error) } });
    }
  }
});
