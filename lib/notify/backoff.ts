/** Retry schedule of the outbox worker. */
export interface BackoffOptions {
  baseMs: number;
  capMs: number;
}

export const defaultBackoff: BackoffOptions = { baseMs: 5_000, capMs: 10 * 60_000 };

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
