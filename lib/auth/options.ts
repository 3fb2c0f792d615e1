import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { requireSetting } from "@/lib/env";
import { endSessions, readSessionState } from "@/lib/data/sessions";
import { checkCredentials, signInAddress } from "./credentials";

/** Thrown from the jwt callback: next-auth then clears the cookie and reports no session. */
class SessionEnded extends Error {}

/**
 * next-auth configuration: e-mail and password, JWT sessions that carry the role. Every use of a session re-reads
 * the person: a disabled account, or a session version bumped by sign-out, password change, reset or role change,
 * ends it; the role reported is always the stored one.
 */
export function buildAuthOptions(): NextAuthOptions {
  return {
    secret: requireSetting("NEXTAUTH_SECRET"),
    session: { strategy: "jwt", maxAge: 14 * 24 * 3600 },
    pages: { signIn: "/sign-in", error: "/sign-in" },
    logger: {
      error(code, metadata) {
        if (code === "JWT_SESSION_ERROR") return; // an ended session, not a fault
        console.error(`[next-auth] ${code}`, metadata);
      },
      warn(code) {
        console.warn(`[next-auth] ${code}`);
      },
      debug() {},
    },
    providers: [
      CredentialsProvider({
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(raw, req) {
          const outcome = await checkCredentials(raw, signInAddress(new Headers(req.headers as Record<string, string>)));
          if (!outcome.ok) {
            if (outcome.reason === "rate-limited") throw new Error("RateLimited");
            return null;
          }
          const { user } = outcome;
          return { id: user.id, email: user.email, name: user.name, role: user.role, sessionVersion: user.sessionVersion };
        },
      }),
    ],
    callbacks: {
      async jwt({ token, user }) {
        if (user && "role" in user && "sessionVersion" in user) {
          token.role = user.role as NonNullable<typeof token.role>;
          token.sv = user.sessionVersion as number;
          return token;
        }
        const state = token.sub ? await readSessionState(token.sub) : null;
        if (!state || state.disabled || state.sessionVersion !== token.sv) throw new SessionEnded("session ended");
        token.role = state.role;
        token.name = state.name;
        return token;
      },
      session({ session, token }) {
        if (session.user) {
          session.user.id = token.sub ?? "";
          session.user.role = token.role;
          session.user.name = token.name;
        }
        return session;
      },
    },
    events: {
      async signOut({ token }) {
        // A copy of the cookie must not outlive the sign-out.
        if (token?.sub) await endSessions(token.sub);
      },
    },
  };
}
