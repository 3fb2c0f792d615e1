import NextAuth from "next-auth";
import { NextResponse, type NextRequest } from "next/server";
import { errorResponse } from "@/lib/api/handler";
import { buildAuthOptions } from "@/lib/auth/options";
import { signInAddress } from "@/lib/auth/credentials";
import { signInRetryAfterSeconds } from "@/lib/auth/rate-limit";
import { readSignInEmail } from "@/lib/auth/sign-in-body";

type NextAuthContext = { params: Promise<{ nextauth: string[] }> };

/** next-auth answers its own errors; what escapes it (a busy database: 503 with Retry-After) gets the API's JSON. */
async function nextAuth(req: NextRequest, ctx: NextAuthContext): Promise<Response> {
  try {
    return await NextAuth(buildAuthOptions())(req, ctx);
  } catch (error) {
    return errorResponse(error);
  }
}

export const GET = nextAuth;

/**
 * Credentials posts are rate-limited per client address and account before next-auth sees them: a clear 429.
 * The e-mail is read from the body the way next-auth reads it (JSON or form), so no body type skips the limit;
 * the check inside authorize() stays as the backstop.
 */
export async function POST(req: NextRequest, ctx: NextAuthContext): Promise<Response> {
  try {
    return await limitedPost(req, ctx);
  } catch (error) {
    return errorResponse(error);
  }
}

async function limitedPost(req: NextRequest, ctx: NextAuthContext): Promise<Response> {
  const { nextauth } = await ctx.params;
  if (nextauth.join("/") === "callback/credentials") {
    const email = await readSignInEmail(req.clone());
    const retryAfterSeconds = await signInRetryAfterSeconds(email, signInAddress(req.headers));
    if (retryAfterSeconds > 0) {
      const url = new URL("/sign-in", req.nextUrl.origin);
      url.searchParams.set("error", "RateLimited");
      url.searchParams.set("retryAfter", String(retryAfterSeconds));
      return NextResponse.json(
        { error: "too many failed sign-ins; wait before trying again", retryAfterSeconds, url: url.toString() },
        { status: 429, headers: { "Retry-After": String(retryAfterSeconds) } },
      );
    }
  }
  return nextAuth(req, ctx);
}
