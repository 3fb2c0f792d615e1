import { asc, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { counterparts, users, type Counterpart, type NewCounterpart } from "@/db/schema";

/** Storage of counterparts: queries only (the service computes searched regions on the sky map). */

export interface CounterpartRow extends Counterpart {
  reportedBy: { id: string; name: string } | null;
}

export async function insertCounterpart(tx: Tx, row: NewCounterpart): Promise<Counterpart> {
  const [stored] = await tx.insert(counterparts).values(row).returning();
  if (!stored) throw new Error("counterpart insert returned nothing");
  return stored;
}

/** A candidate's counterparts with who reported them, first observed first. */
export async function listCounterparts(candidateId: string): Promise<CounterpartRow[]> {
  const db = await getDb();
  const rows = await db
    .select({ counterpart: counterparts, reporter: { id: users.id, name: users.name } })
    .from(counterparts)
    .leftJoin(users, eq(users.id, counterparts.reportedById))
    .where(eq(counterparts.candidateId, candidateId))
    .orderBy(asc(counterparts.observedAt), asc(counterparts.createdAt));
  return rows.map(({ counterpart, reporter }) => ({ ...counterpart, reportedBy: reporter?.id ? reporter : null }));
}
