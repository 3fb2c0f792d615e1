import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { exportPlan } from "@/lib/plans/export";
import { getPlan } from "@/lib/services/read-plans";
import { idParams } from "@/lib/validations/params";
import { planExportQuerySchema } from "@/lib/validations/plans";

/** The plan as a download: ?format=csv (default) or json. */
export const GET = handler({ roles: can.read, params: idParams, query: planExportQuerySchema }, async ({ params, query }) => {
  const file = exportPlan(await getPlan(params.id), query.format);
  return new Response(file.body, {
    headers: { "content-type": file.contentType, "content-disposition": `attachment; filename="${file.fileName}"`, "cache-control": "no-store" },
  });
});
