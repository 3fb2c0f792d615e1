import { describe, expect, it } from "vitest";
import { FeedGenerator, type FeedPost } from "@/fakes/feed/generator";
import { FeedPacer } from "@/fakes/feed/pacing";
import { feedCandidateSchema } from "@/lib/validations/feed";

const sites = ["N1", "S1", "E1"];
const startMs = Date.UTC(2026, 11, 1, 20, 0, 0);
const maps = ["a.fits.gz", "b.fits.gz", "c.fits.gz", "d.fits.gz"];
const HOUR = 3_600_000;
const signalKinds = new Set<FeedPost["kind"]>(["new", "noise", "early-warning"]);

interface Sent {
  atMs: number;
  post: FeedPost;
}

/** Drives the pacer with a made-up clock: every call happens exactly when the pacer asked to be called. */
function simulate(seed: string, hours: number, options: { perHour?: number; skymaps?: readonly string[] } = {}) {
  const generator = new FeedGenerator({ seed, scenario: "gentle", sites, trackSamples: 64, skymapFiles: options.skymaps ?? maps });
  const pacer = new FeedPacer(generator, { candidatesPerHour: options.perHour ?? 6, seed });
  const sent: Sent[] = [];
  let nowMs = startMs;
  let calls = 0;
  while (nowMs < startMs + hours * HOUR) {
    const { post, nextAtMs } = pacer.step(nowMs);
    if (post) sent.push({ atMs: nowMs, post });
    expect(nextAtMs).toBeGreaterThanOrEqual(nowMs);
    nowMs = nextAtMs;
    calls += 1;
    if (calls > 100_000) throw new Error("the pacer never moves its clock on");
  }
  return sent;
}

const signals = (sent: Sent[]) => sent.filter((s) => signalKinds.has(s.post.kind));

describe("the gentle dev feed's pacing (injected clock, seeded generator)", () => {
  it("sends about six new signals an hour: 24 h of three seeds give 6 ± 0.6 per hour", () => {
    for (const seed of ["1", "2", "3"]) {
      const count = signals(simulate(seed, 24)).length;
      expect(count / 24, `seed ${seed}`).toBeGreaterThan(5.4);
      expect(count / 24, `seed ${seed}`).toBeLessThan(6.6);
    }
  });

  it("follows --rate: 12 per hour gives twice as many signals as 6", () => {
    const six = signals(simulate("4", 12)).length;
    const twelve = signals(simulate("4", 12, { perHour: 12 })).length;
    expect(twelve / six).toBeGreaterThan(1.7);
    expect(twelve / six).toBeLessThan(2.3);
  });

  it("keeps new signals 5 to 15 minutes apart (never a burst of alarms)", () => {
    const times = signals(simulate("5", 24)).map((s) => s.atMs);
    for (let i = 1; i < times.length; i++) {
      const gap = (times[i] ?? 0) - (times[i - 1] ?? 0);
      expect(gap).toBeGreaterThanOrEqual(5 * 60_000);
      expect(gap).toBeLessThanOrEqual(15 * 60_000);
    }
  });

  it("sends other pipelines' reports 1.5 s after their lead, a warning's first look 5–30 s after its merger, and some revisions", () => {
    const sent = simulate("6", 24);
    const kinds = new Set(sent.map((s) => s.post.kind));
    for (const kind of ["new", "companion", "noise", "early-warning", "early-warning-update", "revision"]) expect(kinds).toContain(kind);
    const warnings = new Map<string, number>();
    for (const [i, { atMs, post }] of sent.entries()) {
      const payload = post.payload;
      expect(payload, post.description).not.toBeNull();
      if (!payload) continue;
      expect(feedCandidateSchema.safeParse(payload).success, post.description).toBe(true);
      if (post.kind === "companion") expect(atMs - (sent[i - 1]?.atMs ?? 0)).toBe(1_500);
      if (post.kind === "early-warning") warnings.set(payload.externalId, Date.parse(payload.eventTime));
      if (post.kind === "early-warning-update") {
        const mergerMs = warnings.get(payload.externalId);
        expect(mergerMs, post.description).toBeDefined();
        expect(atMs - (mergerMs ?? 0)).toBeGreaterThanOrEqual(5_000);
        expect(atMs - (mergerMs ?? 0)).toBeLessThanOrEqual(30_000);
      }
    }
    // follow-ups are occasional: fewer revisions and withdrawals than signals
    const followUps = sent.filter((s) => s.post.kind === "revision" || s.post.kind === "withdrawal").length;
    expect(followUps).toBeGreaterThan(0);
    expect(followUps).toBeLessThan(signals(sent).length);
  });

  it("answers a call that comes early with nothing, and the same seed gives the same posts at the same times", () => {
    const generator = new FeedGenerator({ seed: "7", scenario: "gentle", sites, trackSamples: 64 });
    const pacer = new FeedPacer(generator, { candidatesPerHour: 6, seed: "7" });
    let step = pacer.step(startMs);
    while (generator.peekCompanion()) step = pacer.step(step.nextAtMs);
    expect(pacer.step(step.nextAtMs - 1).post).toBeNull();
    const a = simulate("7", 6).map((s) => `${s.atMs} ${s.post.rawBody}`);
    expect(simulate("7", 6).map((s) => `${s.atMs} ${s.post.rawBody}`)).toEqual(a);
    expect(simulate("8", 6).map((s) => `${s.atMs} ${s.post.rawBody}`)).not.toEqual(a);
  });
});

describe("the demo sky-map choice", () => {
  it("gives about half of the signals (new lead reports and first looks) one of the four maps, every map in use", () => {
    const sent = simulate("9", 48);
    const eligible = sent.filter((s) => s.post.kind === "new" || s.post.kind === "early-warning-update");
    const withMap = eligible.filter((s) => s.post.skymapFile !== undefined);
    expect(eligible.length).toBeGreaterThan(150);
    expect(withMap.length / eligible.length).toBeGreaterThan(0.4);
    expect(withMap.length / eligible.length).toBeLessThan(0.6);
    const used = new Map<string, number>();
    for (const s of withMap) used.set(s.post.skymapFile ?? "", (used.get(s.post.skymapFile ?? "") ?? 0) + 1);
    expect([...used.keys()].sort()).toEqual(maps);
    for (const n of used.values()) expect(n).toBeGreaterThan(withMap.length / 8);
    // companions, noise, warnings and revisions carry none
    for (const s of sent) if (!eligible.includes(s)) expect(s.post.skymapFile, s.post.description).toBeUndefined();
  });

  it("has a generator of its own: with or without maps the posts and their times are the same", () => {
    const strip = (sent: Sent[]) => sent.map((s) => `${s.atMs} ${s.post.rawBody}`);
    const withMaps = simulate("10", 8);
    const without = simulate("10", 8, { skymaps: [] });
    expect(strip(without)).toEqual(strip(withMaps));
    expect(without.every((s) => s.post.skymapFile === undefined)).toBe(true);
    expect(withMaps.some((s) => s.post.skymapFile !== undefined)).toBe(true);
  });

  it("attaches no map in the scenarios whose posts are refused", () => {
    for (const scenario of ["malformed", "bad-signature"] as const) {
      const generator = new FeedGenerator({ seed: "11", scenario, sites, trackSamples: 64, skymapFiles: maps });
      for (let i = 0; i < 40; i++) expect(generator.next(startMs + i * 60_000).skymapFile).toBeUndefined();
    }
  });
});
