import { clearFailures, countFailures, recordFailures } from "@/lib/data/accounts";

/**
 * Failed sign-ins allowed within the window (common practice: a handful per quarter hour).
 * - `perAddress`: one client address (the socket's, or a trusted proxy's report of it) failing on any accounts.
 * - `perAccountAddress`: one address failing on one account.
 * - `perAccount`: failures on one account from anywhere; past it the account is "under attack" and refuses every
 *   address that has already failed on it, but never one that has not, so nobody can lock a person out of an
 *   on-call tool from elsewhere. There is no global bucket.
 */
export const signInLimits = { windowMs: 15 * 60_000, perAccount: 20, perAccountAddress: 5, perAddress: 30 } as const;

const normaliseEmail = (email: string) => email.trim().toLowerCase();
export const accountBucket = (email: string) => `account:${normaliseEmail(email)}`;
export const addressBucket = (address: string) => `address:${address}`;
export const pairBucket = (email: string, address: string) => `pair:${normaliseEmail(email)} ${address}`;

/** Seconds until this address may try this account again, or 0. */
export async function signInRetryAfterSeconds(email: string, address: string, now = new Date()): Promise<number> {
  const since = new Date(now.getTime() - signInLimits.windowMs);
  const buckets = [accountBucket(email), addressBucket(address), pairBucket(email, address)];
  const rows = await countFailures(buckets, since);
  const of = (bucket: string) => rows.find((r) => r.bucket === bucket);
  const waitFor = (row: (typeof rows)[number] | undefined) =>
    Math.max(1, Math.ceil(((row?.oldest?.getTime() ?? now.getTime()) + signInLimits.windowMs - now.getTime()) / 1000));
  const [account, addr, pair] = buckets.map(of);
  let retryAfter = 0;
  if (addr && addr.n >= signInLimits.perAddress) retryAfter = Math.max(retryAfter, waitFor(addr));
  if (pair && pair.n >= signInLimits.perAccountAddress) retryAfter = Math.max(retryAfter, waitFor(pair));
  if (pair && account && account.n >= signInLimits.perAccount) retryAfter = Math.max(retryAfter, waitFor(account));
  return retryAfter;
}

export async function recordFailedSignIn(email: string, address: string, now = new Date()): Promise<void> {
  // Old rows are of no further use; prune a little on each write.
  await recordFailures([accountBucket(email), addressBucket(address), pairBucket(email, address)], now, new Date(now.getTime() - 2 * signInLimits.windowMs));
}

/** A successful sign-in forgives that address's failures on the account (others' stay counted). */
export async function clearAccountFailures(email: string, address: string): Promise<void> {
  await clearFailures(pairBucket(email, address));
}
