import { z } from "zod";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listFailedNotifications } from "@/lib/data/paging";
import { PAGE_FAILING_ATTEMPTS } from "@/lib/notify/backoff";

/** Messages the worker gave up on, and pages still retrying after repeated failures, for coordinators. */
export const GET = handler(
  { roles: can.readDeliveryFailures, query: z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) }) },
  async ({ query }) => ({ items: await listFailedNotifications(query.limit, PAGE_FAILING_ATTEMPTS) }),
);
