import { pnChirpFrequencyAt } from "@/lib/physics";
import { describe, expect, it } from "vitest";
import { parseRate } from "@/fakes/feed/config";
import { FeedGenerator, scenarios, type Scenario } from "@/fakes/feed/generator";
import { signingHeaders } from "@/fakes/feed/poster";
import { FeedRandom } from "@/fakes/feed/random";
import { makeTrack } from "@/fakes/feed/track";
import { verifyFeedSignature } from "@/lib/feed/signature";
import { feedCandidateSchema, maxTrackSamples } from "@/lib/validations/feed";

const sites = ["N1", "S1", "E1"];
const startMs = Date.UTC(2026, 11, 1, 20, 0, 0);

function run(scenario: Scenario, seed: string, posts: number, stepMs = 30_000) {
  const generator = new FeedGenerator({ seed, scenario, sites, trackSamples: 200 });
  return Array.from({ length: posts }, (_, i) => generator.next(startMs + i * stepMs));
}

describe("the fake feed generator", () => {
  it("is deterministic by seed and differs between seeds", () => {
    for (const scenario of scenarios) {
      const a = run(scenario, "7", 12).map((p) => p.rawBody);
      expect(run(scenario, "7", 12).map((p) => p.rawBody)).toEqual(a);
      expect(run(scenario, "8", 12).map((p) => p.rawBody)).not.toEqual(a);
    }
  });

  it("posts bodies that pass the feed schema in every valid scenario, with revisions and withdrawals in the mix", () => {
    const kinds = new Set<string>();
    for (const scenario of ["mixed", "bns", "nsbh", "bbh", "early-warning", "bad-signature"] as const) {
      for (const post of run(scenario, "7", 80)) {
        kinds.add(post.kind);
        const parsed = feedCandidateSchema.safeParse(JSON.parse(post.rawBody));
        expect(parsed.success, `${scenario}: ${post.description}: ${parsed.error?.message}`).toBe(true);
        expect(post.payload?.frequencyTrack.t.length).toBeLessThanOrEqual(maxTrackSamples);
      }
    }
    for (const kind of ["new", "revision", "early-warning", "early-warning-update", "withdrawal", "bad-signature"]) {
      expect(kinds).toContain(kind);
    }
  });

  it("keeps revisions of one candidate rising and an early warning's merger after the post", () => {
    const posts = run("mixed", "11", 150);
    const last = new Map<string, number>();
    for (const [i, post] of posts.entries()) {
      const payload = post.payload;
      if (!payload) continue;
      const key = `${payload.source}/${payload.externalId}`;
      expect(payload.revision).toBe((last.get(key) ?? 0) + 1);
      last.set(key, payload.revision);
      if (post.kind === "early-warning") {
        expect(Date.parse(payload.eventTime)).toBeGreaterThan(startMs + i * 30_000);
        expect(Math.max(...payload.frequencyTrack.t)).toBeLessThan(0);
      }
    }
  });

  it("reports a signal from one to three pipelines within ±0.3 s, and lone noise triggers with high false-alarm rates", () => {
    const posts = run("mixed", "13", 400);
    const sizes = new Map<number, number>();
    let group: NonNullable<(typeof posts)[number]["payload"]>[] = [];
    const close = () => {
      if (group.length > 0) sizes.set(group.length, (sizes.get(group.length) ?? 0) + 1);
      group = [];
    };
    for (const post of posts) {
      if (post.kind !== "companion") close();
      if (post.kind === "new" && post.payload) group.push(post.payload);
      if (post.kind === "companion" && post.payload) {
        const lead = group[0];
        expect(lead, post.description).toBeDefined();
        if (!lead) continue;
        expect(group.map((p) => p.source)).not.toContain(post.payload.source);
        expect(Math.abs(Date.parse(post.payload.eventTime) - Date.parse(lead.eventTime))).toBeLessThanOrEqual(300);
        // The same source, measured again: masses within a few spreads, not another signal.
        expect(Math.abs(post.payload.masses.m1.mean - lead.masses.m1.mean)).toBeLessThan(4 * lead.masses.m1.sd + 0.01);
        group.push(post.payload);
      }
      if (post.kind === "noise") {
        expect(post.payload?.falseAlarmRatePerYear).toBeGreaterThanOrEqual(3);
        expect(post.payload?.networkSnr).toBeLessThan(10.5);
      }
    }
    close();
    expect([...sizes.keys()].sort()).toEqual([1, 2, 3]);
    expect(posts.filter((p) => p.kind === "noise").length).toBeGreaterThan(5);
  });

  it("samples tracks from the 3.5PN TaylorT4 chirp with the requested noise", () => {
    // The PN evolution itself is checked against an independent scipy integration in tests/physics/chirp-fit-pn.test.ts.
    const eta = Math.min(0.25, (1.25 / 2.9) ** (5 / 3));
    const chirp = (mc: number, tc: number, t: number) => pnChirpFrequencyAt(mc, eta, tc, t);
    const plan = { chirpMassDetectorFrame: 1.25, totalMassDetectorFrame: 2.9, coalescenceTimeS: 0.003, sampleCount: 500 };
    const clean = makeTrack(new FeedRandom("track"), { ...plan, noiseFraction: 0 });
    // Times are rounded to 1 µs and frequencies to 0.1 mHz in the body, hence a relative tolerance.
    for (const [i, t] of clean.t.entries()) {
      expect(Math.abs((clean.f[i] ?? 0) / chirp(1.25, 0.003, t) - 1)).toBeLessThan(1e-5);
    }
    expect(clean.f.every((f, i) => i === 0 || f > (clean.f[i - 1] ?? 0))).toBe(true);
    const noisy = makeTrack(new FeedRandom("track"), { ...plan, noiseFraction: 0.01 });
    const deviations = noisy.f.map((f, i) => f / chirp(1.25, 0.003, noisy.t[i] ?? 0) - 1);
    const rms = Math.sqrt(deviations.reduce((sum, d) => sum + d * d, 0) / deviations.length);
    expect(rms).toBeGreaterThan(0.008);
    expect(rms).toBeLessThan(0.012);
    expect(Math.abs((noisy.fSigma[0] ?? 0) / (0.01 * chirp(1.25, 0.003, noisy.t[0] ?? 0)) - 1)).toBeLessThan(1e-3);
  });

  it("makes malformed bodies the schema refuses, and signatures that fail as named", () => {
    for (const post of run("malformed", "5", 40)) {
      let parsed: unknown;
      try {
        parsed = JSON.parse(post.rawBody);
      } catch {
        expect(post.expectedStatuses).toEqual([400]);
        continue;
      }
      const result = feedCandidateSchema.safeParse(parsed);
      const tooLong = result.success && result.data.frequencyTrack.t.length > maxTrackSamples;
      expect(result.success && !tooLong, post.description).toBe(false);
    }
    const secret = "s".repeat(40);
    const nowMs = startMs;
    const check = (signing: "good" | "wrong-secret" | "stale" | "missing") =>
      verifyFeedSignature(secret, new Headers(signingHeaders(signing, secret, "{}", nowMs)), "{}", nowMs).ok;
    expect([check("good"), check("wrong-secret"), check("stale"), check("missing")]).toEqual([true, false, false, false]);
  });

  it("parses rates", () => {
    expect(parseRate("2/min")).toBe(30_000);
    expect(parseRate("1/s")).toBe(1000);
    expect(parseRate("30/h")).toBe(120_000);
    expect(() => parseRate("fast")).toThrow(/rate/);
  });
});

describe("the fake feed's external ids", () => {
  // A network's public alert names read letter + YYMMDD + day fraction (e.g. X261201a or X261201.12345); ours must not.
  const alertNameLike = /^[A-Z]{1,2}\d{6}(?:[._]?\d+|[a-z]{1,3})?$/;

  it("carry no calendar date, stay unique and sort by event time", () => {
    const posts = run("mixed", "5", 200).filter((p) => p.payload);
    const ids = posts.map((p) => p.payload!.externalId);
    for (const id of ids) {
      expect(id).toMatch(/^trg-[0-9a-z]{9}-[0-9a-z]{2}$/);
      expect(id).not.toMatch(alertNameLike);
    }
    const firstReports = posts.filter((p) => p.payload!.revision === 1).map((p) => p.payload!);
    expect(new Set(firstReports.map((p) => `${p.source}/${p.externalId}`)).size).toBe(firstReports.length);
    const byTime = [...firstReports].sort((a, b) => Date.parse(a.eventTime) - Date.parse(b.eventTime));
    const timeParts = byTime.map((p) => p.externalId.slice(4, 13));
    expect([...timeParts].sort()).toEqual(timeParts);
  });

  it("the alert-name pattern above does recognise the old form, so the check can fail", () => {
    expect("T261201.1234501").toMatch(alertNameLike);
    expect("S261201ab").toMatch(alertNameLike);
  });
});
