import { getDb } from "@/db";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";
import { queueNotifications } from "./outbox";

/** A test message to the person's own devices and inbox, through the same outbox and worker as a real page. */
export async function queueTestPage(user: SessionUser, now = new Date()): Promise<{ eventId: number }> {
  const db = await getDb();
  return db.transaction(async (tx) => {
      const event = await appendEvent(tx, {
        at: now,
        kind: eventKinds.pageQueued,
        actorId: user.id,
        data: { userIds: [user.id], channels: ["push", "email", "in-app"], reason: "test" },
      });
      await queueNotifications(
        tx,
        {
          eventId: event.id,
          kind: "test",
          title: "Test page",
          body: "If you read this on your device or in your inbox, Chirpdesk can reach you there.",
          path: "/notifications",
          channels: ["push", "email"],
          now,
        },
        [user.id],
      );
      return { eventId: event.id };
    });
}
