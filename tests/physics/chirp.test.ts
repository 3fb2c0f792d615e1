import { describe, expect, it } from "vitest";
import { chirpFrequencyAt, chirpMassFromComponents, timeToMergerSeconds } from "@/lib/physics/chirp";
import { SUN_MASS_TIME_S } from "@/lib/physics/constants";

describe("leading-order chirp relations", () => {
  it("uses GM☉/c³ = 4.925490947 µs (IAU 2015 B3 nominal GM☉ with exact c)", () => {
    // 1.3271244e20 / 299792458³ evaluated by hand: 4.9254909476e-6 s.
    expect(SUN_MASS_TIME_S).toBeCloseTo(4.9254909476e-6, 15);
  });

  it("gives τ ≈ 2.18 s at 100 Hz for 𝓜 = 1.21 M☉ (Maggiore 2008, Gravitational Waves Vol. 1, Eq. 4.21)", () => {
    // The textbook quotes three significant figures; allow 0.5 %.
    expect(Math.abs(timeToMergerSeconds(1.21, 100) / 2.18 - 1)).toBeLessThan(0.005);
  });

  it("gives about 17 minutes from 10 Hz for a 1.4 + 1.4 M☉ pair (τ ∝ f^(−8/3), same textbook example)", () => {
    const chirpMass = chirpMassFromComponents(1.4, 1.4);
    // Textbook: 𝓜 ≈ 1.22 M☉ for two 1.4 M☉ stars.
    expect(chirpMass).toBeCloseTo(1.2188, 3);
    const minutes = timeToMergerSeconds(chirpMass, 10) / 60;
    expect(minutes).toBeGreaterThan(16.5);
    expect(minutes).toBeLessThan(17.5);
  });

  it("chirpFrequencyAt inverts timeToMergerSeconds", () => {
    for (const chirpMass of [1.2, 8, 30]) {
      for (const frequencyHz of [15, 60, 250]) {
        const tau = timeToMergerSeconds(chirpMass, frequencyHz);
        expect(chirpFrequencyAt(chirpMass, 5, 5 - tau) / frequencyHz).toBeCloseTo(1, 12);
      }
    }
  });

  it("returns NaN outside the domain instead of throwing", () => {
    expect(timeToMergerSeconds(0, 100)).toBeNaN();
    expect(timeToMergerSeconds(1.2, -1)).toBeNaN();
    expect(chirpFrequencyAt(1.2, 0, 0)).toBeNaN();
    expect(chirpFrequencyAt(1.2, 0, 1)).toBeNaN();
  });
});
