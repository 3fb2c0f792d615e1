import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { createShift, listShifts } from "@/lib/data/rota";
import { findRotaIssues } from "@/lib/notify/rota-coverage";
import { rotaRangeQuerySchema, shiftInputSchema } from "@/lib/validations/rota";

/** Shifts overlapping [from, to) with overlaps and gaps flagged. */
export const GET = handler({ roles: can.read, query: rotaRangeQuerySchema }, async ({ query }) => {
  const shifts = await listShifts(query.from, query.to);
  const spans = shifts.map((s) => ({ id: s.id, startsAt: Date.parse(s.startsAt), endsAt: Date.parse(s.endsAt) }));
  const issues = findRotaIssues(spans, query.from.getTime(), query.to.getTime()).map((i) => ({
    ...i,
    from: new Date(i.from).toISOString(),
    to: new Date(i.to).toISOString(),
  }));
  return { shifts, issues };
});

export const POST = handler({ roles: can.manageRota, body: shiftInputSchema }, async ({ user, body }) => {
  const shift = await createShift(user, body);
  return Response.json(shift, { status: 201 });
});
