import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { config } from "@/lib/env";

/** The application server key a browser passes to PushManager.subscribe (RFC 8292 Section 3.2). */
export const GET = handler({ roles: can.read }, async () => {
  const publicKey = config().VAPID_PUBLIC_KEY;
  if (!publicKey) throw new ApiError(503, "web push is not configured on this server (VAPID_PUBLIC_KEY)");
  return { publicKey };
});
