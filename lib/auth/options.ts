import { eq } from "drizzle-orm";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { z } from "zod";
import { getDb } from "@/db";
import { users, type Role } from "@/db/schema";
import { getEnv } from "@/lib/env";
import { verifyPassword } from "./password";
import { clearAccountFailures, clientAddress, recordFailedSignIn } from "./rate-limit";

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email(),
  password: z.string().min(1).max(200),
});

/** next-auth configuration: e-mail and password, JWT sessions that carry the role. */
export function buildAuthOptions(): NextAuthOptions {
  return {
    secret: getEnv().NEXTAUTH_SECRET,
    session: { strategy: "jwt", maxAge: 14 * 24 * 3600 },
    pages: { signIn: "/sign-in", error: "/sign-in" },
    providers: [
      CredentialsProvider({
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(raw, req) {
          const parsed = credentialsSchema.safeParse(raw);
          if (!parsed.success) return null;
          const { email, password } = parsed.data;
          const address = clientAddress(new Headers(req.headers as Record<string, string>));
          const db = await getDb();
          const [user] = await db.select().from(users).where(eq(users.email, email)).limit(1);
          const ok = user && !user.disabledAt && (await verifyPassword(password, user.passwordHash));
          if (!user || !ok) {
            await recordFailedSignIn(email, address);
            return null;
          }
          await clearAccountFailures(email);
          return { id: user.id, email: user.email, name: user.name, role: user.role };
        },
      }),
    ],
    callbacks: {
      jwt({ token, user }) {
        if (user && "role" in user) token.role = user.role as Role;
        return token;
      },
      session({ session, token }) {
        if (session.user) {
          session.user.id = token.sub ?? "";
          session.user.role = token.role;
        }
        return session;
      },
    },
  };
}
