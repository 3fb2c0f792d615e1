import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { markRead } from "@/lib/data/paging";
import { markReadSchema } from "@/lib/validations/paging";

/** Marks the person's own notifications read: `{ ids }` or `{ all: true }`. Answers the new unread count. */
export const POST = handler({ roles: can.read, body: markReadSchema }, async ({ user, body }) => ({
  unread: await markRead(user.id, body),
}));
