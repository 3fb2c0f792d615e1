import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSite } from "@/lib/data/sites";
import { deleteSite, updateSite } from "@/lib/services/manage-sites";
import { siteFormSchema } from "@/lib/validations/sites";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ site: await getSite(params.id) }));

/** Replaces every field (the form always sends them all), observers included. */
export const PUT = handler({ roles: can.manageSites, params: idParams, body: siteFormSchema }, async ({ user, body, params }) => ({
  site: await updateSite(user, params.id, body),
}));

export const DELETE = handler({ roles: can.manageSites, params: idParams }, async ({ user, params }) => {
  await deleteSite(user, params.id);
  return { deleted: true };
});
