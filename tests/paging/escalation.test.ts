// Escalation timers and the one-click acknowledge link, over real sockets with an injected clock.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { candidates, escalations, events, users } from "@/db/schema";
import { POST as ackConfirm } from "@/app/ack/[token]/confirm/route";
import { describeAckLink } from "@/lib/notify/acknowledge";
import { ackLinkIn, startHarness, type Device, type Harness } from "./support/harness";

let h: Harness;
let backupDevice: Device;
const minute = 60_000;

beforeAll(async () => {
  h = await startHarness();
  await h.subscribe(h.people.primary);
  backupDevice = await h.subscribe(h.people.backup);
  // Shortened deadlines: backup after 1 min, coordinators 1 min later.
  await h.setPolicy({
    steps: [
      { target: "primary", afterMinutes: 0 },
      { target: "backup", afterMinutes: 1 },
      { target: "coordinators", afterMinutes: 1 },
    ],
  });
});
afterAll(() => h.stop());
beforeEach(() => {
  h.push.clearMessages();
  h.smtp.clear();
});

const confirm = (token: string, via?: "push") =>
  ackConfirm.with({ now: h.clock.now })(
    new Request(`http://localhost/ack/${token}/confirm${via ? "?via=push" : ""}`, { method: "POST", headers: { accept: "application/json" } }),
    { params: Promise.resolve({ token }) },
  );

const tokenOf = (link: string) => decodeURIComponent(link.slice(link.lastIndexOf("/") + 1));

describe("escalation", () => {
  it("pages the backup once the deadline passes unacknowledged, then the coordinators", async () => {
    const start = h.clock.now();
    const candidate = await h.postCandidate();
    const worker = h.worker();
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.primary.email })).toHaveLength(1);

    h.clock.set(start + minute - 1_000);
    expect((await worker.runOnce()).escalationsFired).toBe(0);
    expect(h.smtp.messages({ to: h.people.backup.email })).toHaveLength(0);

    h.clock.set(start + minute + 1_000);
    const run = await worker.runOnce();
    expect(run.escalationsFired).toBe(1);
    const [mail] = h.smtp.messages({ to: h.people.backup.email });
    expect(mail?.subject).toContain(`Unacknowledged for 1 min: ${candidate.externalId}`);
    expect(h.push.messages({ subscriptionId: backupDevice.subscriptionId })).toHaveLength(1);
    expect(h.smtp.messages({ to: h.people.coordinator.email })).toHaveLength(0);

    h.clock.set(start + 2 * minute + 1_000);
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.coordinator.email })).toHaveLength(1);
    const fired = await (await getDb()).select().from(events).where(eq(events.candidateId, candidate.id));
    expect(fired.filter((e) => e.kind === "escalation.fired").map((e) => (e.data as { target: string }).target)).toEqual(["backup", "coordinators"]);
  });

  it("stops when the primary acknowledges from the e-mail link: no backup, no coordinators", async () => {
    const start = h.clock.now();
    const candidate = await h.postCandidate();
    const worker = h.worker();
    await worker.runOnce();
    const [mail] = h.smtp.messages({ to: h.people.primary.email });
    const link = ackLinkIn(mail?.text ?? "");

    // Following the link shows a page and changes nothing (a mail scanner's GET cannot acknowledge).
    const shown = await describeAckLink(tokenOf(link), new Date(h.clock.now()));
    expect(shown.state).toBe("ready");
    h.clock.advance(20_000);
    const res = await confirm(tokenOf(link));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ status: "acknowledged", candidateId: candidate.id, acknowledgedBy: h.people.primary.name });

    const db = await getDb();
    const [row] = await db.select().from(candidates).where(eq(candidates.id, candidate.id));
    expect(row?.triageState).toBe("acknowledged");
    expect(row?.acknowledgedById).toBe(h.people.primary.id);
    const timers = await db.select().from(escalations).where(eq(escalations.candidateId, candidate.id));
    expect(timers.map((t) => t.status)).toEqual(["cancelled", "cancelled"]);

    h.clock.set(start + 10 * minute);
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.backup.email })).toHaveLength(0);
    expect(h.smtp.messages({ to: h.people.coordinator.email })).toHaveLength(0);
    const log = await db.select().from(events).where(eq(events.candidateId, candidate.id));
    expect(log.filter((e) => e.kind === "escalation.fired")).toHaveLength(0);
    expect(log.find((e) => e.kind === "candidate.triaged")?.data).toMatchObject({ via: "email" });
  });

  it("cancels a backup page still waiting to be sent when the candidate is acknowledged (push action)", async () => {
    const start = h.clock.now();
    const candidate = await h.postCandidate();
    const worker = h.worker();
    await worker.runOnce();
    await h.smtp.setDown(true);
    h.clock.set(start + minute + 1_000);
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.backup.email })).toHaveLength(0);
    const [pushMail] = (await h.rows({ userId: h.people.primary.id, channel: "push", candidateId: candidate.id })).map((r) => r.payload);
    const ackUrl = String(pushMail?.ackUrl);
    const res = await confirm(tokenOf(ackUrl.replace(/\/confirm$/, "")), "push");
    expect(res.status).toBe(200);
    await h.smtp.setDown(false);
    h.clock.set(start + 30 * minute);
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.backup.email })).toHaveLength(0);
    const backupMail = await h.rows({ userId: h.people.backup.id, channel: "email", candidateId: candidate.id });
    expect(backupMail.map((r) => r.status)).toEqual(["cancelled"]);
  });
});

describe("policy rules and withdrawals", () => {
  it("stops the timers when the feed withdraws the candidate before anyone acknowledged", async () => {
    const start = h.clock.now();
    const candidate = await h.postCandidate();
    await h.postCandidate({ externalId: candidate.externalId, revision: 2, stage: "withdrawn" });
    const timers = await (await getDb()).select().from(escalations).where(eq(escalations.candidateId, candidate.id));
    expect(timers.map((t) => t.status)).toEqual(["cancelled", "cancelled"]);
    h.clock.set(start + 5 * minute);
    await h.worker().runOnce();
    expect(await h.rows({ userId: h.people.backup.id, candidateId: candidate.id })).toHaveLength(0);
  });

  it("tells everyone on the steps in the app only when an in-app-only rule matches, with no timers", async () => {
    await h.setPolicy({
      steps: [
        { target: "primary", afterMinutes: 0 },
        { target: "backup", afterMinutes: 1 },
      ],
      rules: [{ name: "Noisy", stages: [], farAbovePerYear: 10, nightOnly: false, action: "in-app-only" }],
    });
    const candidate = await h.postCandidate({ falseAlarmRatePerYear: 50 });
    const rows = await h.rows({ candidateId: candidate.id });
    expect(rows.map((r) => [r.userId, r.channel]).sort()).toEqual(
      [
        [h.people.primary.id, "in-app"],
        [h.people.backup.id, "in-app"],
      ].sort(),
    );
    expect(rows[0]?.title).toContain("not paged: Noisy");
    expect(await (await getDb()).select().from(escalations).where(eq(escalations.candidateId, candidate.id))).toHaveLength(0);
  });
});

describe("acknowledge links", () => {
  async function freshLink(): Promise<string> {
    h.smtp.clear();
    await h.postCandidate();
    await h.worker().runOnce();
    const [mail] = h.smtp.messages({ to: h.people.primary.email });
    return tokenOf(ackLinkIn(mail?.text ?? ""));
  }

  it("refuses a forged link: altered signature, altered expiry, or an unknown id", async () => {
    const token = await freshLink();
    const [id, expiry, sig] = token.split(".") as [string, string, string];
    const flipped = sig.slice(0, 10) + (sig[10] === "A" ? "B" : "A") + sig.slice(11);
    const later = (parseInt(expiry, 36) + 3_600_000).toString(36);
    for (const forged of [`${id}.${expiry}.${flipped}`, `${id}.${later}.${sig}`, `00000000-0000-4000-8000-000000000000.${expiry}.${sig}`, "nonsense"]) {
      const res = await confirm(forged);
      expect(res.status).toBe(403);
      expect(((await res.json()) as { reason: string }).reason).toBe("forged");
    }
    expect((await confirm(token)).status).toBe(200);
  });

  it("refuses an expired link (two hours after it was made)", async () => {
    const token = await freshLink();
    h.clock.advance(2 * 3_600_000 + 1);
    const res = await confirm(token);
    expect(res.status).toBe(410);
    expect(((await res.json()) as { reason: string }).reason).toBe("expired");
    expect((await describeAckLink(token, new Date(h.clock.now()))).state).toBe("refused");
  });

  it("refuses a link used once already, and a browser form POST is sent back to the page", async () => {
    const token = await freshLink();
    const form = await ackConfirm.with({ now: h.clock.now })(new Request(`http://localhost/ack/${token}/confirm`, { method: "POST" }), {
      params: Promise.resolve({ token }),
    });
    expect(form.status).toBe(303);
    expect(form.headers.get("location")).toBe(`/ack/${encodeURIComponent(token)}?done=1`);
    const again = await confirm(token);
    expect(again.status).toBe(409);
    expect(((await again.json()) as { reason: string }).reason).toBe("used");
    const page = await describeAckLink(token, new Date(h.clock.now()));
    expect(page).toMatchObject({ state: "refused", reason: "used" });
  });

  it("a refused attempt (owner demoted since the page) does not spend the link; it works once the role is back", async () => {
    const token = await freshLink();
    const db = await getDb();
    await db.update(users).set({ role: "observer" }).where(eq(users.id, h.people.primary.id));
    const refused = await confirm(token);
    expect(refused.status).toBe(403);
    expect(((await refused.json()) as { reason: string }).reason).toBe("not-allowed");
    await db.update(users).set({ role: "shifter" }).where(eq(users.id, h.people.primary.id));
    expect((await confirm(token)).status).toBe(200);
  });
});
