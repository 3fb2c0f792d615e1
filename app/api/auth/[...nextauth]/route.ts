import NextAuth from "next-auth";
import { NextResponse, type NextRequest } from "next/server";
import { buildAuthOptions } from "@/lib/auth/options";
import { clientAddress, signInRetryAfterSeconds } from "@/lib/auth/rate-limit";

type NextAuthContext = { params: Promise<{ nextauth: string[] }> };

function nextAuth(req: NextRequest, ctx: NextAuthContext) {
  return NextAuth(buildAuthOptions())(req, ctx);
}

export const GET = nextAuth;

/** Credentials posts are rate-limited per account and address before next-auth sees them: a clear 429. */
export async function POST(req: NextRequest, ctx: NextAuthContext) {
  const { nextauth } = await ctx.params;
  if (nextauth.join("/") === "callback/credentials") {
    const form = await req.clone().formData().catch(() => null);
    const email = String(form?.get("email") ?? "");
    const retryAfterSeconds = await signInRetryAfterSeconds(email, clientAddress(req.headers));
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
