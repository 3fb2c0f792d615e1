import { z } from "zod";
import { notFound } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getDeadLetter, listDeadLetters } from "@/lib/data/dead-letters";

const querySchema = z.object({
  /** one letter, whole raw body included */
  id: z.string().min(1).max(100).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  before: z.iso.datetime().optional(),
});

/** Refused feed posts, newest first (reason, field issues, raw body preview), or one whole letter by id. */
export const GET = handler({ roles: can.readDeliveryFailures, query: querySchema }, async ({ query }) => {
  if (query.id) {
    const letter = await getDeadLetter(query.id);
    if (!letter) throw notFound("dead letter");
    return { deadLetter: letter };
  }
  const before = query.before ? new Date(query.before) : undefined;
  return { deadLetters: await listDeadLetters({ limit: query.limit, before }) };
});
