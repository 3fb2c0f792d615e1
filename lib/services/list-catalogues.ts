import { getDb } from "@/db";
import { notFound } from "@/lib/api/errors";
import { findCatalogue, listCatalogues } from "@/lib/data/catalogues";
import { toCatalogueRecord, type CatalogueRecord } from "@/lib/galaxies/catalogue-record";

export async function listCatalogueRecords(): Promise<CatalogueRecord[]> {
  return (await listCatalogues(await getDb())).map(toCatalogueRecord);
}

export async function getCatalogueRecord(id: string): Promise<CatalogueRecord> {
  const row = await findCatalogue(await getDb(), id);
  if (!row) throw notFound("catalogue");
  return toCatalogueRecord(row);
}
