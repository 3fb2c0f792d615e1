import { describe, expect, it } from "vitest";
import { observingOrder } from "@/components/plans/plan-pointings";
import { planFootprints, sitePatterns, siteStyles } from "@/components/skymap/footprints";
import { siteColours } from "@/components/skymap/query-keys";
import type { PlanRecord, PointingRecord } from "@/lib/plans/record";

const pointing = (index: number, plannedStart: string | null): PointingRecord => ({
  id: `p${index}`,
  index,
  raDeg: 120 + index,
  decDeg: -30,
  probability: 0.1,
  gainedProbability: 0.1,
  cumulativeProbability: 0.1 * index,
  plannedStart,
  plannedEnd: plannedStart,
  altitudeDeg: plannedStart ? 50 : null,
  airmass: null,
  moonSeparationDeg: null,
  unscheduledReason: plannedStart ? null : "no-time-left",
  doneAt: null,
  doneBy: null,
});

const plan = (code: string, closedAt: string | null, pointings: PointingRecord[]): PlanRecord =>
  ({ id: `plan-${code}`, site: { id: code, code, name: code, timeZone: "UTC" }, footprint: { shape: "rectangle", widthDeg: 2, heightDeg: 1 }, closedAt, pointings }) as unknown as PlanRecord;

describe("drawing plans on the sky", () => {
  it("gives every site its own colour and line pattern, in code order, whatever order the codes come in", () => {
    const styles = siteStyles(["WLB", "ALD", "KRN", "ALD"], siteColours);
    expect([...styles.keys()]).toEqual(["ALD", "KRN", "WLB"]);
    const pairs = [...styles.values()].map((s) => `${s.colour.join(" ")}|${s.dash}`);
    expect(new Set(pairs).size).toBe(3);
    expect(new Set([...styles.values()].map((s) => s.dash)).size).toBe(3); // patterns differ too, not colour alone
    expect(styles.get("ALD")).toEqual({ colour: siteColours[0], dash: sitePatterns[0] });
  });

  it("outlines every pointing of the open plans (a rectangle's four corners), none of the closed ones", () => {
    const styles = siteStyles(["A", "B"], siteColours);
    const tiles = planFootprints([plan("A", null, [pointing(1, null), pointing(2, null)]), plan("B", "2030-01-01T00:00:00Z", [pointing(1, null)])], styles);
    expect(tiles.map((t) => [t.siteCode, t.index, t.outline.length])).toEqual([
      ["A", 1, 4],
      ["A", 2, 4],
    ]);
    expect(tiles[0]?.dash).toBe(styles.get("A")?.dash);
  });

  it("lists pointings in observing order: scheduled by time, then the unscheduled by number", () => {
    const order = observingOrder([pointing(1, "2030-03-21T03:00:00Z"), pointing(2, null), pointing(3, "2030-03-21T01:00:00Z"), pointing(4, null)]);
    expect(order.map((p) => p.index)).toEqual([3, 1, 2, 4]);
  });
});
