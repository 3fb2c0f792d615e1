/**
 * The baseline for bench/ingest.ts: the rows the feed route writes for a new candidate, written straight through
 * the libSQL client with the route's own statements (lib/data/ingest-sql.ts) and one write transaction each,
 * derived quantities precomputed. The route also runs the paging hook's reads; the baseline does not.
 */
import { randomUUID } from "node:crypto";
import type { Client } from "@libsql/client";
import type { FeedPost } from "@/fakes/feed/generator";
import {
  insertCandidateStatement,
  insertCreatedEventStatement,
  insertDerivedStatement,
  insertRevisionStatement,
  insertTriggerStatement,
  lookupStatement,
  type NewCandidateRow,
} from "@/lib/data/ingest-sql";
import { deriveForFeed } from "@/lib/feed/derive";
import { derivationSeed, toPhysicsInput } from "@/lib/feed/physics-input";
import { defaultPhysicsSettings } from "@/lib/physics";
import { feedCandidateSchema } from "@/lib/validations/feed";

export type DirectRow = Omit<NewCandidateRow, "candidateId" | "triggerId" | "revisionId">;

export async function precomputeRows(posts: FeedPost[]): Promise<DirectRow[]> {
  const receivedAtMs = Date.now();
  return posts.map((post) => {
    const payload = feedCandidateSchema.parse(JSON.parse(post.rawBody));
    const derived = deriveForFeed(toPhysicsInput(payload, new Date(receivedAtMs)), defaultPhysicsSettings, derivationSeed(payload));
    return { payload, payloadJson: JSON.stringify(payload), derivedJson: derived.json, headline: derived.headline, receivedAtMs };
  });
}

/** Milliseconds to write every row, sequentially, one write transaction each, with the route's own statements. */
export async function insertDirect(client: Client, rows: DirectRow[]): Promise<number> {
  const started = performance.now();
  for (const source of rows) {
    const row: NewCandidateRow = { ...source, candidateId: randomUUID(), triggerId: randomUUID(), revisionId: randomUUID() };
    await client.execute(lookupStatement(row.payload));
    await client.execute({ sql: "select value from settings where key = ? limit 1", args: ["physics"] });
    const tx = await client.transaction("write");
    try {
      await tx.execute(lookupStatement(row.payload));
      await tx.execute(insertCandidateStatement(row));
      await tx.execute(insertTriggerStatement(row));
      await tx.execute(insertCreatedEventStatement(row));
      await tx.execute(insertRevisionStatement(row));
      await tx.execute(insertDerivedStatement(row));
      await tx.commit();
    } finally {
      tx.close();
    }
  }
  return performance.now() - started;
}
