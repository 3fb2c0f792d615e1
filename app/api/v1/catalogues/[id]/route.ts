import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getCatalogueRecord } from "@/lib/services/list-catalogues";
import { deleteCatalogue } from "@/lib/services/delete-catalogue";
import { updateCatalogue } from "@/lib/services/update-catalogue";
import { cataloguePatchSchema } from "@/lib/validations/catalogues";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ catalogue: await getCatalogueRecord(params.id) }));

export const PATCH = handler({ roles: can.manageCatalogues, params: idParams, body: cataloguePatchSchema }, async ({ user, params, body, now }) => ({
  catalogue: await updateCatalogue(user, params.id, body, now),
}));

export const DELETE = handler({ roles: can.manageCatalogues, params: idParams }, async ({ user, params, now }) => ({
  deleted: true,
  ...(await deleteCatalogue(user, params.id, now)),
}));
