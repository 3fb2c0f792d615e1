import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

/** Fixtures written by tests/fixtures/scripts/skymap_make_fixtures.py (healpy + astropy on Debian). */
export const FIXTURE_DIR = fileURLToPath(new URL("../fixtures/skymap/", import.meta.url));

export function fixtureBytes(name: string): Uint8Array {
  return new Uint8Array(readFileSync(path.join(FIXTURE_DIR, name)));
}

export interface ReferenceCone {
  raDeg: number;
  decDeg: number;
  radiusDeg: number;
  probability: number;
}

export interface ReferenceMap {
  layout: "flat-ring" | "flat-nested" | "multiorder";
  nside?: number;
  maxOrder?: number;
  pixelCount: number;
  totalProbability: number;
  area50Deg2: number;
  area90Deg2: number;
  peak: { raDeg: number; decDeg: number };
  cones: ReferenceCone[];
  grid64?: { sum: number; top: Array<[number, number]>; area90Deg2: number };
}

export interface Reference {
  maps: Record<string, ReferenceMap>;
  singleFisherAnalytic: {
    raDeg: number;
    decDeg: number;
    sigmaDeg: number;
    area50Deg2: number;
    area90Deg2: number;
    cap: Array<{ radiusDeg: number; probability: number }>;
  };
}

export const reference = JSON.parse(readFileSync(path.join(FIXTURE_DIR, "reference.json"), "utf8")) as Reference;

/** Great-circle angle between two positions, degrees (haversine form). */
export function separationDeg(a: { raDeg: number; decDeg: number }, b: { raDeg: number; decDeg: number }): number {
  const rad = Math.PI / 180;
  const h =
    Math.sin(((b.decDeg - a.decDeg) * rad) / 2) ** 2 +
    Math.cos(a.decDeg * rad) * Math.cos(b.decDeg * rad) * Math.sin(((b.raDeg - a.raDeg) * rad) / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(h)))) / rad;
}

export function relativeDifference(value: number, expected: number): number {
  return Math.abs(value - expected) / Math.abs(expected);
}
