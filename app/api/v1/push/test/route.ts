import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { queueTestPage } from "@/lib/notify/test-page";

/** Queues a test message to the person's own devices and inbox. */
export const POST = handler({ roles: can.read }, async ({ user }) => queueTestPage(user));
