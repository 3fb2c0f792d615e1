// One signal, one page: triggers of several pipelines grouped into one candidate, over real sockets (fake push
// service and fake SMTP server), and the re-page rule of lib/notify/repage.ts.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { startHarness, type Device, type Harness } from "./support/harness";

let h: Harness;
let device: Device;

beforeAll(async () => {
  h = await startHarness();
  device = await h.subscribe(h.people.primary);
});
afterAll(() => h.stop());
beforeEach(async () => {
  h.push.clearMessages();
  h.smtp.clear();
  await h.setPolicy({});
});

/** Event times of one signal, ten minutes from the previous test's. */
let signalMs = Date.UTC(2031, 2, 4, 11, 0, 0);
function nextSignal(): (offsetMs: number) => string {
  signalMs += 10 * 60_000;
  const base = signalMs;
  return (offsetMs) => new Date(base + offsetMs).toISOString();
}

async function deliveredToPrimary() {
  const worker = h.worker();
  await worker.runOnce();
  await worker.runOnce();
  return {
    push: h.push.messages({ subscriptionId: device.subscriptionId }).length,
    mail: h.smtp.messages({ to: h.people.primary.email }).length,
  };
}

describe("a signal reported by three pipelines", () => {
  it("pages the primary once, by push and by e-mail, though the preferred trigger changes", async () => {
    const at = nextSignal();
    const a = await h.postCandidate({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 0.2 });
    const b = await h.postCandidate({ source: "pipe-b", eventTime: at(-280), falseAlarmRatePerYear: 0.004 });
    const c = await h.postCandidate({ source: "pipe-c", eventTime: at(300), falseAlarmRatePerYear: 0.05 });
    expect(new Set([a.id, b.id, c.id]).size).toBe(1);
    expect(await deliveredToPrimary()).toEqual({ push: 1, mail: 1 });
    expect(await h.rows({ userId: h.people.primary.id, channel: "in-app", candidateId: a.id })).toHaveLength(1);
  });

  it("while two separate signals page twice", async () => {
    const first = nextSignal();
    const second = nextSignal();
    const a = await h.postCandidate({ source: "pipe-a", eventTime: first(0) });
    const b = await h.postCandidate({ source: "pipe-b", eventTime: second(0) });
    expect(a.id).not.toBe(b.id);
    expect(await deliveredToPrimary()).toEqual({ push: 2, mail: 2 });
  });
});

describe("the re-page rule", () => {
  const lowSignificance = { name: "Low significance", stages: [], farAbovePerYear: 1, nightOnly: false, action: "in-app-only" };

  it("pages when a joining trigger takes the candidate below the ladder's false-alarm threshold, and not again after", async () => {
    await h.setPolicy({ rules: [lowSignificance] });
    const at = nextSignal();
    const noisy = await h.postCandidate({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 40 });
    expect(await deliveredToPrimary()).toEqual({ push: 0, mail: 0 });
    const better = await h.postCandidate({ source: "pipe-b", eventTime: at(150), falseAlarmRatePerYear: 0.01 });
    expect(better.id).toBe(noisy.id);
    expect(await deliveredToPrimary()).toEqual({ push: 1, mail: 1 });
    h.push.clearMessages();
    h.smtp.clear();
    await h.postCandidate({ source: "pipe-c", eventTime: at(-150), falseAlarmRatePerYear: 0.001 });
    expect(await deliveredToPrimary()).toEqual({ push: 0, mail: 0 });
  });

  it("does not page for a joining trigger that stays above the threshold", async () => {
    await h.setPolicy({ rules: [lowSignificance] });
    const at = nextSignal();
    await h.postCandidate({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 40 });
    await h.postCandidate({ source: "pipe-b", eventTime: at(150), falseAlarmRatePerYear: 3 });
    expect(await deliveredToPrimary()).toEqual({ push: 0, mail: 0 });
  });
});
