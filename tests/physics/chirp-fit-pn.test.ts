import { describe, expect, it } from "vitest";
import fixture from "@/tests/fixtures/physics/taylor-t4-tracks.json";
import { fitPnTrack } from "@/lib/physics/chirp-fit-pn";
import { SeededRandom } from "@/lib/physics/random";

// Tracks evolved at 3.5PN (TaylorT4, Buonanno et al. 2009 Eq. 3.6; spin terms of Kidder 1995) with scipy's
// solve_ivp, DOP853 at rtol 1e-12: tests/fixtures/scripts/physics_taylor_t4_tracks.py.
const point = (m: number) => ({ mean: m, sd: 0 });

describe("3.5PN TaylorT4 chirp fit against an independent scipy integration", () => {
  for (const track of fixture.tracks) {
    const isBbh = track.mass2DetectorFrame >= 5;
    it(`recovers the chirp mass of the ${track.name} within ${isBbh ? 1 : 0.5} % and t_c within 1 ms`, () => {
      const input = { mass1: point(track.mass1DetectorFrame), mass2: point(track.mass2DetectorFrame), chi1: track.chi1, chi2: track.chi2 };
      const fit = fitPnTrack({ t: track.t, f: track.f }, input, "fixture");
      if (!fit.ok) throw new Error(fit.detail);
      expect(Math.abs(fit.value.chirpMassDetectorFrame / track.chirpMassDetectorFrame - 1)).toBeLessThan(isBbh ? 0.01 : 0.005);
      expect(Math.abs(fit.value.coalescenceTimeS)).toBeLessThan(1e-3);
    });
  }

  it("reports a 1σ that covers the truth about 68 % of the time over noisy realisations, mass-ratio spread included", () => {
    let covered = 0;
    const trials = 240;
    const random = new SeededRandom("coverage");
    for (let k = 0; k < trials; k++) {
      const track = fixture.tracks[k % 4] as (typeof fixture.tracks)[number];
      // The trigger's masses scatter about the truth by their own quoted 5 % sd.
      const sd1 = 0.05 * track.mass1DetectorFrame;
      const sd2 = 0.05 * track.mass2DetectorFrame;
      const input = {
        mass1: { mean: track.mass1DetectorFrame + sd1 * random.normal(), sd: sd1 },
        mass2: { mean: track.mass2DetectorFrame + sd2 * random.normal(), sd: sd2 },
        chi1: track.chi1,
        chi2: track.chi2,
      };
      const f = track.f.map((value) => value * (1 + 0.01 * random.normal()));
      const fit = fitPnTrack({ t: track.t, f, fSigma: track.f.map((value) => 0.01 * value) }, input, `c${k}`);
      if (!fit.ok) throw new Error(fit.detail);
      if (Math.abs(fit.value.chirpMassDetectorFrame - track.chirpMassDetectorFrame) <= fit.value.chirpMassDetectorFrameSd) covered++;
    }
    // Binomial: 68 % ± 3 sd of √(0.68·0.32/240) ≈ 3 %.
    expect(covered / trials).toBeGreaterThan(0.59);
    expect(covered / trials).toBeLessThan(0.77);
  });
});
