import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { buildOpenApiDocument } from "@/lib/feed/openapi";

/** The API description, for any signed-in role (every route checks a role). */
export const GET = handler({ roles: can.read }, async ({ req }) => buildOpenApiDocument(req.nextUrl.origin));
