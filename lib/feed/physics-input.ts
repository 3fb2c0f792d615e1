import type { TriggerPhysicsInput } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";

/** The seed that makes a revision's sampled quantities reproducible: the same post always derives the same numbers. */
export function derivationSeed(payload: Pick<FeedCandidate, "source" | "externalId" | "revision">): string {
  return `${payload.source}/${payload.externalId}/${payload.revision}`;
}

/** Maps a validated feed body to the physics module's input; receipt time fixes "seconds to merger". */
export function toPhysicsInput(payload: FeedCandidate, receivedAt: Date): TriggerPhysicsInput {
  const { t, f, fSigma } = payload.frequencyTrack;
  return {
    frequencyTrack: fSigma ? { t, f, fSigma } : { t, f },
    masses: payload.masses,
    ...(payload.spins ? { spins: payload.spins } : {}),
    ...(payload.distanceMpc ? { distanceMpc: payload.distanceMpc } : {}),
    secondsSinceEventTimeAtReceipt: (receivedAt.getTime() - Date.parse(payload.eventTime)) / 1000,
    networkSnr: payload.networkSnr,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
  };
}
