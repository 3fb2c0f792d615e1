import { getDb } from "@/db";
import { ApiError, notFound } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { findCatalogue, renameCatalogue, setDefaultCatalogue } from "@/lib/data/catalogues";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";
import { toCatalogueRecord, type CatalogueRecord } from "@/lib/galaxies/catalogue-record";
import type { CataloguePatch } from "@/lib/validations/catalogues";

/** Renames a catalogue and/or makes it the default (the previous default stops being one); audited. */
export async function updateCatalogue(actor: SessionUser, id: string, patch: CataloguePatch, now: Date): Promise<CatalogueRecord> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const existing = await findCatalogue(tx, id);
    if (!existing) throw notFound("catalogue");
    if (patch.isDefault && existing.state !== "ready") throw new ApiError(409, "the catalogue is still importing; it can become the default once it is ready");
    if (patch.name !== undefined && patch.name !== existing.name) {
      await renameCatalogue(tx, id, patch.name);
      await appendEvent(tx, { at: now, kind: eventKinds.catalogueChanged, actorId: actor.id, data: { catalogueId: id, name: patch.name, action: "renamed" } });
    }
    if (patch.isDefault && !existing.isDefault) {
      await setDefaultCatalogue(tx, id);
      await appendEvent(tx, { at: now, kind: eventKinds.catalogueChanged, actorId: actor.id, data: { catalogueId: id, name: patch.name ?? existing.name, action: "made-default" } });
    }
    const row = await findCatalogue(tx, id);
    if (!row) throw notFound("catalogue");
    return toCatalogueRecord(row);
  });
}
