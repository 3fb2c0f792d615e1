import { describe, expect, it } from "vitest";
import { formatDistance } from "@/components/skymap/format";

describe("formatDistance", () => {
  it("rounds to whole Mpc from 100 Mpc and keeps three significant figures below", () => {
    expect(formatDistance(1534.6, 393.4)).toBe("1,535 ± 393 Mpc");
    expect(formatDistance(45.678, 12.34)).toBe("45.7 ± 12.3 Mpc");
  });
});
