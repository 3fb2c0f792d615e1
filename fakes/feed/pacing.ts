import type { FeedGenerator, FeedPost } from "./generator";
import { FeedRandom } from "./random";

export interface FeedPacerOptions {
  /** mean number of new signals (candidates) per hour */
  candidatesPerHour: number;
  seed: string;
  /** chance that a follow-up (revision or withdrawal of an earlier signal) falls between two signals */
  followUpChance?: number;
  /** the pause before another pipeline's report of the same signal */
  companionDelayMs?: number;
}

export interface PacedStep {
  /** what to send now; null when the call came before anything was due */
  post: FeedPost | null;
  /** when to call `step` again (Unix ms) */
  nextAtMs: number;
}

/** Gaps between signals are uniform in [1 − spread, 1 + spread] × the mean gap: steady, never a burst. */
export const gapSpread = 0.5;

/**
 * The gentle dev feed's clock: new signals at about `candidatesPerHour` (gaps of 0.5–1.5 × the mean, drawn from a
 * seeded generator of its own), another pipeline's report of a signal a moment after it, an early warning's first
 * look shortly after its merger, and now and then one revision or withdrawal between two signals. Pure: the caller
 * passes the time in and waits until `nextAtMs`, so a test drives it with a made-up clock.
 */
export class FeedPacer {
  private readonly rng: FeedRandom;
  private readonly meanGapMs: number;
  private nextSignalAtMs: number | null = null;
  private followUpAtMs: number | null = null;

  constructor(
    private readonly generator: FeedGenerator,
    private readonly options: FeedPacerOptions,
  ) {
    if (!(options.candidatesPerHour > 0)) throw new Error("candidatesPerHour must be positive");
    this.meanGapMs = 3_600_000 / options.candidatesPerHour;
    this.rng = new FeedRandom(`${options.seed}/pace`);
  }

  step(nowMs: number): PacedStep {
    const post = this.due(nowMs);
    return { post, nextAtMs: this.nextAt(nowMs) };
  }

  private due(nowMs: number): FeedPost | null {
    if (this.generator.peekCompanion()) return this.generator.nextSignal(nowMs);
    const nextSignalAtMs = this.nextSignalAtMs ?? nowMs;
    if (this.followUpAtMs !== null && nowMs >= this.followUpAtMs && this.followUpAtMs <= nextSignalAtMs) {
      this.followUpAtMs = null;
      return this.generator.nextFollowUp(nowMs);
    }
    if (nowMs < nextSignalAtMs) return null;
    const post = this.generator.nextSignal(nowMs);
    const gapMs = this.meanGapMs * this.rng.uniform(1 - gapSpread, 1 + gapSpread);
    this.nextSignalAtMs = nowMs + gapMs;
    if (post.kind === "early-warning" && post.payload) {
      // The first look follows the merger by 5–30 s, as the pipelines' latency would have it.
      this.followUpAtMs = Date.parse(post.payload.eventTime) + this.rng.uniform(5_000, 30_000);
    } else if (this.rng.chance(this.options.followUpChance ?? 0.3)) {
      this.followUpAtMs = nowMs + gapMs * this.rng.uniform(0.2, 0.8);
    }
    return post;
  }

  private nextAt(nowMs: number): number {
    if (this.generator.peekCompanion()) return nowMs + (this.options.companionDelayMs ?? 1_500);
    const signal = this.nextSignalAtMs ?? nowMs;
    return Math.max(nowMs, this.followUpAtMs === null ? signal : Math.min(this.followUpAtMs, signal));
  }
}
