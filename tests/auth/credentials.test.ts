import bcrypt from "bcryptjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { checkCredentials } from "@/lib/auth/credentials";
import { verifyPassword } from "@/lib/auth/password";
import { setupTestDatabase, createTestUser, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

/** Counts bcrypt comparisons and the cost of each hash compared, so the test sees the work, not the clock. */
function countingVerify() {
  const costs: number[] = [];
  return {
    costs,
    verify: async (password: string, hash: string) => {
      costs.push(bcrypt.getRounds(hash));
      return verifyPassword(password, hash);
    },
  };
}

describe("checking credentials", () => {
  it("does the same bcrypt work for an unknown e-mail as for a wrong password, so timing tells nothing", async () => {
    const user = await createTestUser("shifter", { password: "right-password" });
    const known = countingVerify();
    expect(await checkCredentials({ email: user.email, password: "wrong" }, "192.0.2.50", known.verify)).toEqual({ ok: false, reason: "invalid" });
    const unknown = countingVerify();
    expect(await checkCredentials({ email: "nobody@example.test", password: "wrong" }, "192.0.2.51", unknown.verify)).toEqual({
      ok: false,
      reason: "invalid",
    });
    expect(unknown.costs).toHaveLength(1);
    expect(unknown.costs).toEqual(known.costs);
    // the stored hash is at the production cost (lib/auth/password.ts), so the dummy is too
    expect(unknown.costs[0]).toBe(11);
  });

  it("signs in with the right password and refuses once the address's limit for the account is reached", async () => {
    const user = await createTestUser("observer", { password: "right-password" });
    const good = await checkCredentials({ email: user.email, password: "right-password" }, "192.0.2.60");
    expect(good.ok).toBe(true);
    for (let i = 0; i < 5; i++) await checkCredentials({ email: user.email, password: "nope" }, "192.0.2.61");
    expect(await checkCredentials({ email: user.email, password: "right-password" }, "192.0.2.61")).toEqual({ ok: false, reason: "rate-limited" });
    expect((await checkCredentials({ email: user.email, password: "right-password" }, "192.0.2.62")).ok).toBe(true);
  });
});
