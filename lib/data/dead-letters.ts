import { desc, eq, lt } from "drizzle-orm";
import { getDb } from "@/db";
import { deadLetters } from "@/db/schema";
import type { FieldIssue } from "@/lib/api/errors";

export interface DeadLetterInput {
  receivedAt: Date;
  statusCode: number;
  reason: string;
  issues?: FieldIssue[];
  rawBody: string;
}

/** Best effort: who sent it, if the body was JSON with those fields, so a coordinator can find the sender. */
function senderOf(rawBody: string): { source: string | null; externalId: string | null } {
  try {
    const parsed: unknown = JSON.parse(rawBody);
    if (parsed && typeof parsed === "object" && !Array.isArray(parsed)) {
      const { source, externalId } = parsed as Record<string, unknown>;
      return {
        source: typeof source === "string" ? source.slice(0, 200) : null,
        externalId: typeof externalId === "string" ? externalId.slice(0, 200) : null,
      };
    }
  } catch {
    // not JSON: nothing to extract
  }
  return { source: null, externalId: null };
}

/** Keeps a refused (but correctly signed) feed post, raw, with the reason it was refused. */
export async function recordDeadLetter(input: DeadLetterInput): Promise<string> {
  const db = await getDb();
  const [row] = await db
    .insert(deadLetters)
    .values({
      receivedAt: input.receivedAt,
      statusCode: input.statusCode,
      reason: input.reason.slice(0, 2000),
      issues: input.issues ?? null,
      rawBody: input.rawBody,
      ...senderOf(input.rawBody),
    })
    .returning({ id: deadLetters.id });
  if (!row) throw new Error("dead letter insert returned nothing");
  return row.id;
}

export interface DeadLetterSummary {
  id: string;
  receivedAt: Date;
  statusCode: number;
  reason: string;
  issues: FieldIssue[] | null;
  source: string | null;
  externalId: string | null;
  rawBodyBytes: number;
  /** the first characters of the raw body; the whole body is read with `getDeadLetter` */
  rawBodyPreview: string;
}

const previewChars = 2000;

/** Newest first, paged by `before` (a receivedAt instant). */
export async function listDeadLetters(options: { limit?: number; before?: Date } = {}): Promise<DeadLetterSummary[]> {
  const db = await getDb();
  const limit = Math.min(Math.max(options.limit ?? 50, 1), 200);
  const rows = await db
    .select()
    .from(deadLetters)
    .where(options.before ? lt(deadLetters.receivedAt, options.before) : undefined)
    .orderBy(desc(deadLetters.receivedAt))
    .limit(limit);
  return rows.map((row) => ({
    id: row.id,
    receivedAt: row.receivedAt,
    statusCode: row.statusCode,
    reason: row.reason,
    issues: row.issues,
    source: row.source,
    externalId: row.externalId,
    rawBodyBytes: Buffer.byteLength(row.rawBody, "utf8"),
    rawBodyPreview: row.rawBody.slice(0, previewChars),
  }));
}

export async function getDeadLetter(id: string) {
  const db = await getDb();
  const [row] = await db.select().from(deadLetters).where(eq(deadLetters.id, id)).limit(1);
  return row ?? null;
}
