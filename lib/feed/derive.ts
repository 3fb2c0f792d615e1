import { computeDerived, type PhysicsSettings, type TriggerPhysicsInput } from "@/lib/physics";
import type { DerivedForFeed } from "./derive-messages";
import { headlineFromDerived } from "@/lib/data/headline";

/** computeDerived plus what the feed stores beside it; the same on a physics thread and inline. */
export function deriveForFeed(input: TriggerPhysicsInput, settings: PhysicsSettings, seed: string): DerivedForFeed {
  const derived = computeDerived(input, settings, seed);
  return { json: JSON.stringify(derived), headline: headlineFromDerived(derived) };
}
