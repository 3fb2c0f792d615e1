import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";

/** Written by tests/fixtures/scripts/astro_make_fixtures.py with Debian's python3-astropy. */
export interface AstroSnapshot {
  time: string;
  gmstDeg: number;
  sun: { raDeg: number; decDeg: number; distanceKm: number; altDeg: number };
  moon: {
    raDeg: number;
    decDeg: number;
    distanceKm: number;
    altDeg: number;
    illumination: number;
    separationFromTargetDeg: number;
  };
  target: { altDeg: number; precessedRaDeg: number; precessedDecDeg: number };
}

export interface AstroCase {
  site: string;
  latDeg: number;
  lonDeg: number;
  elevationM: number;
  now: string;
  sunAltAtNowDeg: number;
  sunCrossings: Array<{ time: string; rising: boolean }>;
  targetCrossings: Record<"south" | "north", Array<{ time: string; rising: boolean }>>;
  snapshots: AstroSnapshot[];
}

export interface AstroReference {
  limitDeg: number;
  targets: Record<"south" | "north", { raDeg: number; decDeg: number }>;
  cases: AstroCase[];
}

export const astroReference = JSON.parse(
  readFileSync(fileURLToPath(new URL("../fixtures/astro/reference.json", import.meta.url)), "utf8"),
) as AstroReference;

export const minutesBetween = (a: Date, b: string) => Math.abs(a.getTime() - Date.parse(b)) / 60_000;
