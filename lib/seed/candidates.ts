import type { Database } from "@/db";

/** Past candidates for the demo, fed through the real ingest path (filled in with the feed). */
export async function seedPastCandidates(_db: Database, _now: Date): Promise<number> {
  return 0;
}
