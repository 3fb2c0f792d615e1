import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";

/**
 * Every /api path no route claims (Next matches the specific routes first, next-auth's included): a JSON 404 for
 * API callers instead of the HTML not-found page. The same answer for anyone, signed in or not.
 */
const unknownPath = handler({ anyone: true }, async ({ req }) => {
  throw new ApiError(404, `no API route at ${req.nextUrl.pathname}`, { reason: "unknown-path" });
});

export const GET = unknownPath;
export const POST = unknownPath;
export const PUT = unknownPath;
export const PATCH = unknownPath;
export const DELETE = unknownPath;
