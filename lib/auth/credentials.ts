import type { BlockList } from "node:net";
import { z } from "zod";
import type { User } from "@/db/schema";
import { findUserByEmail } from "@/lib/data/accounts";
import { config } from "@/lib/env";
import { clientAddress, parseTrustedProxies } from "./client-address";
import { hashPassword, verifyPassword } from "./password";
import { clearAccountFailures, recordFailedSignIn, signInRetryAfterSeconds } from "./rate-limit";

export const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email(),
  password: z.string().min(1).max(200),
});

let trusted: { text: string | undefined; list: BlockList } | undefined;
let warnedUnstamped = false;

/** The caller's address for the sign-in limits, from TRUSTED_PROXIES (parsed once) and the socket stamp. */
export function signInAddress(headers: Headers): string {
  const settings = config();
  const text = settings.TRUSTED_PROXIES;
  if (!trusted || trusted.text !== text) trusted = { text, list: parseTrustedProxies(text) };
  const address = clientAddress(headers, trusted.list, !!settings.CHIRPDESK_PEER_HEADER);
  if (address.startsWith("unknown:") && !warnedUnstamped && settings.NODE_ENV === "production") {
    warnedUnstamped = true;
    console.warn("[chirpdesk] the server was started without server/peer-address.mjs; sign-in limits cannot see client addresses");
  }
  return address;
}

let dummyHash: Promise<string> | undefined;
/** A hash at the real cost, so an unknown e-mail costs the same bcrypt work as a wrong password. */
function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword("no account has this password " + Math.random());
  return dummyHash;
}

export type SignInOutcome = { ok: true; user: User } | { ok: false; reason: "invalid" | "rate-limited" };

/**
 * Checks an e-mail and password from whatever body next-auth accepted. Exactly one bcrypt comparison runs whether
 * or not the account exists or is disabled (common practice against account enumeration by timing).
 */
export async function checkCredentials(
  raw: unknown,
  address: string,
  verify: (password: string, hash: string) => Promise<boolean> = verifyPassword,
): Promise<SignInOutcome> {
  const parsed = credentialsSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, reason: "invalid" };
  const { email, password } = parsed.data;
  if ((await signInRetryAfterSeconds(email, address)) > 0) return { ok: false, reason: "rate-limited" };
  const user = await findUserByEmail(email);
  const matches = await verify(password, user?.passwordHash ?? (await dummyPasswordHash()));
  if (!user || user.disabledAt || !matches) {
    await recordFailedSignIn(email, address);
    return { ok: false, reason: "invalid" };
  }
  await clearAccountFailures(email, address);
  return { ok: true, user };
}
