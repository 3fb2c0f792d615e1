import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listCatalogueRecords } from "@/lib/services/list-catalogues";
import { importCatalogue } from "@/lib/services/import-catalogue";

/** Multipart upload: the CSV in field `file`, an optional `name`; streamed, so no body cap here (the service's limits apply). */
export const POST = handler({ roles: can.manageCatalogues }, async ({ user, req, now }) =>
  NextResponse.json(await importCatalogue(user, req, { now }), { status: 201 }),
);

export const GET = handler({ roles: can.read }, async () => ({ catalogues: await listCatalogueRecords() }));
