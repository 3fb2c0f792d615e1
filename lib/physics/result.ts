/** Typed failures: physics functions return these instead of throwing. */

export type PhysicsFailureCode =
  | "missing-input"
  | "length-mismatch"
  | "too-few-samples"
  | "non-finite-value"
  | "non-positive-frequency"
  | "non-positive-uncertainty"
  | "times-not-increasing"
  | "frequency-not-rising"
  | "track-implausible"
  | "track-not-chirp-like"
  | "non-physical-slope"
  | "degenerate-fit"
  | "invalid-mass"
  | "invalid-spin"
  | "invalid-distance"
  | "distance-out-of-range"
  | "invalid-settings"
  | "sampling-exhausted"
  | "spin-outside-fit"
  | "non-finite-result"
  | "internal-error";

export interface PhysicsFailure {
  ok: false;
  reason: PhysicsFailureCode;
  detail: string;
}

export type PhysicsResult<T> = { ok: true; value: T } | PhysicsFailure;

export function fail(reason: PhysicsFailureCode, detail: string): PhysicsFailure {
  return { ok: false, reason, detail };
}

export function succeed<T>(value: T): { ok: true; value: T } {
  return { ok: true, value };
}

/** One-line human-readable reason, e.g. "too-few-samples: 2 samples, need at least 3". */
export function describeFailure(failure: PhysicsFailure): string {
  return `${failure.reason}: ${failure.detail}`;
}
