/** Retry schedule of the outbox worker. */
export interface BackoffOptions {
  baseMs: number;
  capMs: number;
}

export const defaultBackoff: BackoffOptions = { baseMs: 5_000, capMs: 10 * 60_000 };

/**
 * Pages for a candidate nobody has answered yet: someone must be woken, so retries never stop and never wait more
 * than 30 s, which bounds the delay after an outage ends (issue: every page within 60 s of recovery).
 */
export const pageBackoff: BackoffOptions = { baseMs: 2_000, capMs: 30_000 };

/** Failed attempts of one page after which the next escalation step fires at once instead of on its timer. */
export const PAGE_FAILING_ATTEMPTS = 3;

/**
 * "Full jitter": a uniform delay in [0, min(cap, base·2^(attempt−1))), so retries of many rows after an outage
 * spread out instead of arriving together (M. Brooker, "Exponential Backoff And Jitter", AWS Architecture Blog, 2015).
 * `attempt` counts from 1; `random` is in [0, 1).
 */
export function retryDelayMs(attempt: number, random: number, options: BackoffOptions = defaultBackoff): number {
  const exponent = Math.min(Math.max(attempt - 1, 0), 30);
  const ceiling = Math.min(options.capMs, options.baseMs * 2 ** exponent);
  return Math.floor(Math.min(Math.max(random, 0), 0.999_999) * ceiling);
}
