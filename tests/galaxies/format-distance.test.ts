import { describe, expect, it } from "vitest";
import { formatDistance } from "@/components/skymap/format";

describe("formatDistance", () => {
  it("rounds to whole Mpc from 100 Mpc and keeps three significant figures below, one unbreakable piece", () => {
    expect(formatDistance(1534.6, 393.4)).toBe("1,535\u00a0±\u00a0393\u00a0Mpc");
    expect(formatDistance(45.678, 12.34)).toBe("45.7\u00a0±\u00a012.3\u00a0Mpc");
  });
});
