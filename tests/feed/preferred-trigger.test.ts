import { describe, expect, it } from "vitest";
import { choosePreferred, compareTriggers, type RankedTrigger } from "@/lib/triggers/preferred";

const t = (id: string, far: number, snr: number, o: Partial<RankedTrigger> = {}): RankedTrigger => ({
  id,
  falseAlarmRatePerYear: far,
  networkSnr: snr,
  receivedAtMs: 1_000,
  withdrawn: false,
  ...o,
});

describe("the preferred trigger (lowest false-alarm rate, ties to the highest network SNR)", () => {
  it("takes the lowest false-alarm rate even against a higher SNR", () => {
    expect(choosePreferred([t("a", 0.1, 30), t("b", 0.01, 9)], "lowest-far")?.id).toBe("b");
  });

  it("breaks a false-alarm-rate tie by the higher SNR, then the earlier receipt, then the id", () => {
    expect(choosePreferred([t("a", 0.01, 9), t("b", 0.01, 11)], "lowest-far")?.id).toBe("b");
    expect(choosePreferred([t("b", 0.01, 9, { receivedAtMs: 2_000 }), t("a", 0.01, 9, { receivedAtMs: 3_000 })], "lowest-far")?.id).toBe("b");
    expect(choosePreferred([t("b", 0.01, 9), t("a", 0.01, 9)], "lowest-far")?.id).toBe("a");
  });

  it("swaps the first two keys under the highest-SNR rule", () => {
    expect(choosePreferred([t("a", 0.1, 30), t("b", 0.01, 9)], "highest-snr")?.id).toBe("a");
    expect(choosePreferred([t("a", 0.1, 12), t("b", 0.01, 12)], "highest-snr")?.id).toBe("b");
  });

  it("passes over withdrawn triggers while any live one remains, and falls back to all of them", () => {
    expect(choosePreferred([t("a", 0.001, 30, { withdrawn: true }), t("b", 5, 8)], "lowest-far")?.id).toBe("b");
    expect(choosePreferred([t("a", 0.001, 30, { withdrawn: true }), t("b", 5, 8, { withdrawn: true })], "lowest-far")?.id).toBe("a");
    expect(choosePreferred([], "lowest-far")).toBeNull();
  });

  it("does not depend on the order of the rows", () => {
    const rows = [t("a", 0.5, 10), t("b", 0.01, 8), t("c", 0.01, 8, { receivedAtMs: 500 }), t("d", 0.01, 12, { withdrawn: true })];
    const first = choosePreferred(rows, "lowest-far")?.id;
    expect(first).toBe("c");
    expect(choosePreferred([...rows].reverse(), "lowest-far")?.id).toBe(first);
    expect(compareTriggers(rows[1] as RankedTrigger, rows[1] as RankedTrigger, "lowest-far")).toBe(0);
  });
});
