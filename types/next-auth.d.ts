import type { Role } from "@/db/schema";

declare module "next-auth" {
  interface Session {
    user?: { id: string; role?: Role; name?: string | null; email?: string | null; image?: string | null };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    role?: Role;
    /** users.session_version when the session began; a different stored value ends the session */
    sv?: number;
  }
}
