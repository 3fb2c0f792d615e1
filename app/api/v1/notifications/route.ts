import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { countUnread, listMyNotifications } from "@/lib/data/paging";
import { notificationListQuerySchema } from "@/lib/validations/paging";

/** The signed-in person's notifications (in-app copies, with push/e-mail delivery states) and the unread count. */
export const GET = handler({ roles: can.read, query: notificationListQuerySchema }, async ({ user, query }) => ({
  items: await listMyNotifications(user.id, { limit: query.limit, before: query.before, unreadOnly: query.unread === "1" }),
  unread: await countUnread(user.id),
  me: { id: user.id, timeZone: user.timeZone },
}));
