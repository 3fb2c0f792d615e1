import type { FeedCandidate } from "@/lib/validations/feed";
import { malformBody } from "./malformed";
import { buildPayload } from "./payload";
import { drawSource, type FakeSource, type FakeSourceClass } from "./population";
import { FeedRandom } from "./random";
import { companionPlan, noiseSource } from "./signals";

export const scenarios = ["gentle", "mixed", "bns", "nsbh", "bbh", "early-warning", "malformed", "bad-signature"] as const;
export type Scenario = (typeof scenarios)[number];

/** Our invented pipelines. */
export const fakeSources = ["pipeline-alpha", "pipeline-beta", "pipeline-gamma"] as const;

/** good: signed now with the right secret; the others are the ways a signature fails. */
export type Signing = "good" | "wrong-secret" | "stale" | "missing";

export interface FeedPost {
  kind:
    | "new"
    /** the same signal from another pipeline, sent right after its "new" post */
    | "companion"
    /** a lone trigger from one pipeline with a high false-alarm rate */
    | "noise"
    | "revision"
    | "early-warning"
    | "early-warning-update"
    | "withdrawal"
    | "malformed"
    | "bad-signature";
  /** one line for the log */
  description: string;
  rawBody: string;
  /** the valid payload, when the body is one */
  payload: FeedCandidate | null;
  signing: Signing;
  /** statuses the route should answer */
  expectedStatuses: number[];
  /** a demo sky map (file name among the generator's `skymapFiles`) to attach after the post is accepted */
  skymapFile?: string;
}

export interface FeedGeneratorOptions {
  seed: string;
  scenario: Scenario;
  /** detector site codes of the (fictional) network */
  sites: readonly string[];
  /** samples per frequency track */
  trackSamples?: number;
  /** demo sky-map files; about half of the signals (a new signal's lead report, a first look after a warning)
   * get one of them, chosen by a generator of their own so the posts themselves do not change */
  skymapFiles?: readonly string[];
}

/** Share of signals that carry a demo sky map. */
export const skymapShare = 0.5;

interface IssuedCandidate {
  source: string;
  externalId: string;
  truth: FakeSource;
  revision: number;
  eventTimeMs: number;
  withdrawn: boolean;
  awaitingFirstLook: boolean;
}

/**
 * `trg-<event time, ms since 1970, base 36, 9 characters>-<counter, base 36, 2 characters>`: our own id scheme.
 * Fixed widths keep it sortable by event time; it carries no calendar date and no leading letter code, so it
 * cannot be mistaken for a network's public alert name (letter + YYMMDD + day fraction).
 */
function externalIdFor(eventTimeMs: number, counter: number): string {
  const time = Math.max(0, Math.floor(eventTimeMs)).toString(36).padStart(9, "0");
  return `trg-${time}-${(counter % 1296).toString(36).padStart(2, "0")}`;
}

/**
 * A pure, seeded candidate feed. Each `next(nowMs)` returns the post to send at `nowMs`; the same seed, scenario
 * and sequence of `nowMs` always give the same posts.
 */
export class FeedGenerator {
  private readonly rng: FeedRandom;
  private readonly skymapRng: FeedRandom;
  private readonly issued: IssuedCandidate[] = [];
  /** other pipelines' reports of the last new signal, sent on the next calls before anything else */
  private readonly companions: FeedPost[] = [];
  private counter = 0;

  constructor(private readonly options: FeedGeneratorOptions) {
    this.rng = new FeedRandom(`${options.seed}/${options.scenario}`);
    this.skymapRng = new FeedRandom(`${options.seed}/${options.scenario}/skymaps`);
  }

  /** The gentle dev feed's next signal: another pipeline's report of the last one, else a new signal. */
  nextSignal(nowMs: number): FeedPost {
    const companion = this.companions.shift();
    if (companion) return companion;
    const roll = this.rng.next();
    if (roll < 0.1) return this.earlyWarning(nowMs);
    if (roll < 0.2) return this.noise(nowMs);
    const r = this.rng.next();
    return this.newCandidate(nowMs, r < 0.4 ? "bns" : r < 0.6 ? "nsbh" : "bbh");
  }

  /** The gentle dev feed's follow-up of an earlier signal: a warning's first look, a revision or a withdrawal. */
  nextFollowUp(nowMs: number): FeedPost | null {
    const waiting = this.issued.find((c) => c.awaitingFirstLook);
    if (waiting) return this.firstLookAfterWarning(waiting, nowMs);
    if (this.rng.chance(0.1)) {
      const withdrawal = this.withdrawal(nowMs);
      if (withdrawal) return withdrawal;
    }
    return this.pickRevision(1);
  }

  /** Whether the next post is another pipeline's report of the last new signal. */
  peekCompanion(): boolean {
    return this.companions.length > 0;
  }

  next(nowMs: number): FeedPost {
    const rng = this.rng;
    const companion = this.companions.shift();
    if (companion) return companion;
    switch (this.options.scenario) {
      case "gentle":
        return this.nextSignal(nowMs);
      case "bns":
      case "nsbh":
      case "bbh":
        return this.pickRevision(0.15) ?? this.newCandidate(nowMs, this.options.scenario);
      case "early-warning": {
        const waiting = this.issued.find((c) => c.awaitingFirstLook);
        return waiting ? this.firstLookAfterWarning(waiting, nowMs) : this.earlyWarning(nowMs);
      }
      case "malformed": {
        const bad = malformBody(this.newCandidate(nowMs, "bns").payload as FeedCandidate, rng);
        return { kind: "malformed", description: bad.defect, rawBody: bad.rawBody, payload: null, signing: "good", expectedStatuses: [bad.expectedStatus] };
      }
      case "bad-signature": {
        const post = this.newCandidate(nowMs, rng.pick(["bns", "nsbh", "bbh"] as const));
        const signing = rng.pick(["wrong-secret", "stale", "missing"] as const);
        return { ...post, kind: "bad-signature", description: `${signing} signature on ${post.description}`, signing, expectedStatuses: [401] };
      }
      case "mixed": {
        const waiting = this.issued.find((c) => c.awaitingFirstLook);
        if (waiting && rng.chance(0.7)) return this.firstLookAfterWarning(waiting, nowMs);
        const roll = rng.next();
        if (roll < 0.05) {
          const withdrawal = this.withdrawal(nowMs);
          if (withdrawal) return withdrawal;
        }
        if (roll < 0.25) {
          const revision = this.pickRevision(1);
          if (revision) return revision;
        }
        if (roll < 0.37) return this.earlyWarning(nowMs);
        if (roll < 0.45) return this.noise(nowMs);
        const r = rng.next();
        return this.newCandidate(nowMs, r < 0.4 ? "bns" : r < 0.6 ? "nsbh" : "bbh");
      }
    }
  }

  private remember(candidate: IssuedCandidate): void {
    this.issued.push(candidate);
    if (this.issued.length > 30) this.issued.shift();
  }

  /** About half of the signals get one of the demo sky maps (none without `skymapFiles`). */
  private withSkymap(post: FeedPost): FeedPost {
    const files = this.options.skymapFiles ?? [];
    // Refused posts (bad bodies, bad signatures) have no candidate to attach a map to.
    if (this.options.scenario === "malformed" || this.options.scenario === "bad-signature") return post;
    if (files.length === 0 || !this.skymapRng.chance(skymapShare)) return post;
    const skymapFile = this.skymapRng.pick(files);
    return { ...post, skymapFile, description: `${post.description} + sky map ${skymapFile}` };
  }

  private post(kind: FeedPost["kind"], description: string, payload: FeedCandidate): FeedPost {
    return { kind, description, rawBody: JSON.stringify(payload), payload, signing: "good", expectedStatuses: [201] };
  }

  private newCandidate(nowMs: number, sourceClass: FakeSourceClass): FeedPost {
    const rng = this.rng;
    const truth = drawSource(rng, sourceClass, this.options.sites);
    // First look: the pipeline reports 15–90 s after the merger.
    const eventTimeMs = nowMs - rng.uniform(15_000, 90_000);
    const candidate: IssuedCandidate = {
      source: rng.pick(fakeSources),
      externalId: externalIdFor(eventTimeMs, this.counter++),
      truth,
      revision: 1,
      eventTimeMs,
      withdrawn: false,
      awaitingFirstLook: false,
    };
    this.remember(candidate);
    const payload = this.payloadFor(candidate, "first-look", 1);
    // Scenarios that test signatures or bodies send one post per signal.
    if (this.options.scenario === "mixed" || this.options.scenario === "gentle" || this.options.scenario === sourceClass) {
      for (const { source, offsetMs } of companionPlan(rng, fakeSources, candidate.source)) {
        const other: IssuedCandidate = { ...candidate, source, externalId: externalIdFor(eventTimeMs, this.counter++), eventTimeMs: eventTimeMs + offsetMs };
        this.remember(other);
        const body = this.payloadFor(other, "first-look", 1);
        this.companions.push(this.post("companion", `${source} also reports ${candidate.externalId} as ${other.externalId}`, body));
      }
    }
    return this.withSkymap(this.post("new", `new ${sourceClass} ${candidate.externalId}`, payload));
  }

  private noise(nowMs: number): FeedPost {
    const rng = this.rng;
    const eventTimeMs = nowMs - rng.uniform(15_000, 90_000);
    const candidate: IssuedCandidate = {
      source: rng.pick(fakeSources),
      externalId: externalIdFor(eventTimeMs, this.counter++),
      truth: noiseSource(drawSource(rng, "bbh", this.options.sites), rng),
      revision: 1,
      eventTimeMs,
      withdrawn: false,
      awaitingFirstLook: false,
    };
    this.remember(candidate);
    const payload = this.payloadFor(candidate, "first-look", 1.5);
    return this.post("noise", `noise ${candidate.source} ${candidate.externalId}`, payload);
  }

  private earlyWarning(nowMs: number): FeedPost {
    const rng = this.rng;
    const truth = drawSource(rng, "bns", this.options.sites);
    const leadS = rng.uniform(10, 60);
    const eventTimeMs = nowMs + leadS * 1000;
    const candidate: IssuedCandidate = {
      source: rng.pick(fakeSources),
      externalId: externalIdFor(eventTimeMs, this.counter++),
      truth,
      revision: 1,
      eventTimeMs,
      withdrawn: false,
      awaitingFirstLook: true,
    };
    this.remember(candidate);
    // The track stops a couple of seconds before the post leaves (pipeline latency).
    const payload = this.payloadFor(candidate, "early-warning", 1.5, -leadS - rng.uniform(1, 3));
    return this.post("early-warning", `early warning ${candidate.externalId}, merger in ${leadS.toFixed(0)} s`, payload);
  }

  private firstLookAfterWarning(candidate: IssuedCandidate, nowMs: number): FeedPost {
    candidate.awaitingFirstLook = false;
    candidate.revision += 1;
    const sinceMergerS = (nowMs - candidate.eventTimeMs) / 1000;
    // If the merger has not happened yet when this goes out, the track still ends before now.
    const lastSample = sinceMergerS < 0 ? sinceMergerS - 1 : undefined;
    const payload = this.payloadFor(candidate, "first-look", 1, lastSample);
    return this.withSkymap(this.post("early-warning-update", `first look after warning ${candidate.externalId} r${candidate.revision}`, payload));
  }

  private pickRevision(probability: number): FeedPost | null {
    const open = this.issued.filter((c) => !c.withdrawn && !c.awaitingFirstLook);
    if (open.length === 0 || !this.rng.chance(probability)) return null;
    const candidate = this.rng.pick(open);
    candidate.revision += 1;
    const stage = candidate.revision === 2 ? "confirmed" : "revised";
    const payload = this.payloadFor(candidate, stage, 0.7);
    return this.post("revision", `${stage} ${candidate.externalId} r${candidate.revision}`, payload);
  }

  private withdrawal(nowMs: number): FeedPost | null {
    const open = this.issued.filter((c) => !c.withdrawn && !c.awaitingFirstLook && nowMs - c.eventTimeMs < 6 * 3600_000);
    if (open.length === 0) return null;
    const candidate = this.rng.pick(open);
    candidate.withdrawn = true;
    candidate.revision += 1;
    const payload = this.payloadFor(candidate, "withdrawn", 1);
    return this.post("withdrawal", `withdrawn ${candidate.externalId} r${candidate.revision}`, payload);
  }

  private payloadFor(
    candidate: IssuedCandidate,
    stage: FeedCandidate["stage"],
    precision: number,
    lastSampleTimeS?: number,
  ): FeedCandidate {
    return buildPayload(this.rng, candidate.truth, {
      source: candidate.source,
      externalId: candidate.externalId,
      revision: candidate.revision,
      stage,
      eventTimeMs: candidate.eventTimeMs,
      precision,
      trackSamples: this.options.trackSamples ?? 400,
      lastSampleTimeS,
    });
  }
}
