import type { PhysicsSettings, TriggerPhysicsInput } from "@/lib/physics";
import type { DerivedHeadline } from "@/lib/data/headline";

export interface DeriveJob {
  id: number;
  input: TriggerPhysicsInput;
  settings: PhysicsSettings;
  seed: string;
}

/** The derived quantities as stored and answered (JSON text) and the headline numbers copied into columns. */
export interface DerivedForFeed {
  json: string;
  headline: DerivedHeadline;
}

export interface DeriveJobResult extends DerivedForFeed {
  id: number;
}
