import { z } from "zod";
import { stages } from "@/db/schema/candidate-values";
import { detectorCodePattern } from "@/lib/feed/detector-code";

/** A track longer than this is refused with 422 after the schema check (the 5 MB body limit comes first). */
export const maxTrackSamples = 200_000;

const finite = z.number();
const gaussian = (what: string, unit: string) =>
  z
    .strictObject({
      mean: finite.positive().meta({ description: `mean ${what}, ${unit}` }),
      sd: finite.nonnegative().meta({ description: `one standard deviation, ${unit}` }),
    })
    .meta({ description: `${what}: a normal approximation` });

const spin = finite.min(-1).max(1);

/** A component mass outside 0.1–1000 M☉ is no compact object the network can see (limits are ours). */
const componentMass = (what: string) =>
  z
    .strictObject({
      mean: finite.min(0.1).max(1000).meta({ description: `mean ${what}, solar masses, 0.1–1000` }),
      sd: finite.nonnegative().max(1000).meta({ description: "one standard deviation, solar masses" }),
    })
    .meta({ description: `${what}: a normal approximation` });

export const frequencyTrackSchema = z
  .strictObject({
    t: z.array(finite).meta({ description: "sample times, seconds relative to eventTime (negative before merger)" }),
    f: z.array(finite).meta({ description: "gravitational-wave frequency at each time, Hz" }),
    fSigma: z
      .array(finite.nonnegative())
      .optional()
      .meta({
        description:
          "optional 1σ of each frequency, Hz, from the pipeline's own noise model. Do not send σ proportional to the " +
          "observed (noisy) frequency: weights 1/σ² then favour samples that scattered low and bias the fit; " +
          "omit fSigma instead and the fit estimates the scatter from the residuals.",
      }),
  })
  .superRefine((track, ctx) => {
    if (track.f.length !== track.t.length) {
      ctx.addIssue({ code: "custom", path: ["f"], message: `has ${track.f.length} samples; t has ${track.t.length}` });
    }
    if (track.fSigma && track.fSigma.length !== track.t.length) {
      ctx.addIssue({
        code: "custom",
        path: ["fSigma"],
        message: `has ${track.fSigma.length} samples; t has ${track.t.length}`,
      });
    }
  })
  .meta({ description: "frequency track: t, f (and fSigma) have equal length, at most 200 000 samples" });

/**
 * The body of `POST /api/v1/feed/candidates` (Chirpdesk's own format). Unknown keys are refused (422), so a
 * misspelt optional field is reported instead of silently dropped.
 */
export const feedCandidateSchema = z
  .strictObject({
    source: z
      .string()
      .trim()
      .min(1)
      .max(64)
      .meta({ description: "the posting pipeline's name" }),
    externalId: z
      .string()
      .trim()
      .min(1)
      .max(64)
      .meta({ description: "the feed's own id for this candidate; (source, externalId) names a candidate" }),
    revision: z
      .number()
      .int()
      .min(1)
      .max(1_000_000)
      .meta({ description: "integer ≥ 1, rises with each update of the candidate" }),
    stage: z.enum(stages).meta({ description: "where the pipeline is with this candidate" }),
    eventTime: z.iso.datetime().meta({ description: "the feed's estimate of merger time, ISO-8601 UTC (Z)" }),
    detectors: z
      .array(z.string().regex(detectorCodePattern, "a site code is 1–4 uppercase letters or digits, letter first"))
      .min(1)
      .max(16)
      .refine((codes) => new Set(codes).size === codes.length, "site codes must not repeat")
      .meta({ description: "site codes of the detectors that saw it, e.g. N1, S1, E1 (fictional network)" }),
    networkSnr: finite.positive().max(10_000).meta({ description: "network signal-to-noise ratio" }),
    falseAlarmRatePerYear: finite.nonnegative().meta({ description: "false alarms per year at this ranking" }),
    frequencyTrack: frequencyTrackSchema,
    masses: z
      .strictObject({ m1: componentMass("component mass 1"), m2: componentMass("component mass 2") })
      .meta({ description: "component masses, detector frame" }),
    spins: z
      .strictObject({ chi1: spin, chi2: spin })
      .optional()
      .meta({ description: "aligned dimensionless spin components, each in [-1, 1]" }),
    distanceMpc: gaussian("luminosity distance", "Mpc").optional(),
  })
  .meta({ title: "FeedCandidate", description: "One revision of a candidate trigger, as the feed posts it." });

export type FeedCandidate = z.infer<typeof feedCandidateSchema>;
