import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listObserverOptions, listSites } from "@/lib/data/sites";
import { createSite } from "@/lib/services/manage-sites";
import { siteFormSchema } from "@/lib/validations/sites";

export const GET = handler({ roles: can.read }, async () => ({ sites: await listSites(), observerOptions: await listObserverOptions() }));

export const POST = handler({ roles: can.manageSites, body: siteFormSchema }, async ({ user, body }) =>
  NextResponse.json({ site: await createSite(user, body) }, { status: 201 }),
);
