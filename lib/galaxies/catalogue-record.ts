import type { Catalogue } from "@/db/schema";

/** A catalogue as the API shows it. */
export interface CatalogueRecord {
  id: string;
  name: string;
  state: Catalogue["state"];
  isDefault: boolean;
  rows: number;
  uploadedById: string | null;
  createdAt: string;
}

export function toCatalogueRecord(row: Catalogue): CatalogueRecord {
  return { id: row.id, name: row.name, state: row.state, isDefault: row.isDefault, rows: row.rowCount, uploadedById: row.uploadedById, createdAt: row.createdAt.toISOString() };
}
