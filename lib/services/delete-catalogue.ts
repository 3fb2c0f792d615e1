import { getDb } from "@/db";
import { notFound } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { findCatalogue, newestReadyCatalogue, removeCatalogue, setDefaultCatalogue } from "@/lib/data/catalogues";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";

/**
 * Deletes a catalogue and its galaxies (also one left `importing` by a crashed upload). When it was the default,
 * the newest remaining ready catalogue becomes the default, so ranking keeps working without a choice.
 */
export async function deleteCatalogue(actor: SessionUser, id: string, now: Date): Promise<{ newDefaultId: string | null }> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const existing = await findCatalogue(tx, id);
    if (!existing) throw notFound("catalogue");
    await removeCatalogue(tx, id);
    let newDefaultId: string | null = null;
    if (existing.isDefault) {
      const next = await newestReadyCatalogue(tx, id);
      if (next) {
        await setDefaultCatalogue(tx, next.id);
        newDefaultId = next.id;
      }
    }
    await appendEvent(tx, { at: now, kind: eventKinds.catalogueChanged, actorId: actor.id, data: { catalogueId: id, name: existing.name, action: "deleted" } });
    return { newDefaultId };
  });
}
