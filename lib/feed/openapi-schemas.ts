/** Hand-written JSON Schemas (2020-12, as OpenAPI 3.1 uses) for answers the zod schemas do not describe. */

type JsonSchema = Record<string, unknown>;

const num = (description: string): JsonSchema => ({ type: "number", description });
const nullable = (schema: JsonSchema): JsonSchema => ({ anyOf: [schema, { type: "null" }] });
const reason = (what: string): JsonSchema => ({
  type: ["string", "null"],
  description: `why ${what} is null; null when it was computed`,
});
const valueWithSd = (unit: string): JsonSchema => ({
  type: "object",
  required: ["value", "sd"],
  properties: { value: num(unit), sd: num(`one standard deviation, ${unit}`) },
});

export const derivedSchema: JsonSchema = {
  type: "object",
  description:
    "Quantities derived from one revision by the physics module. Any block that could not be computed is null " +
    "with a one-line reason in the matching *Error field. Further diagnostic fields (fit, plot, settingsUsed) may appear.",
  required: ["chirpMass", "coalescenceTime", "secondsToMerger", "classProbabilities", "pNeutronStar", "pRemnantMatter", "mergerFrequency", "redshift"],
  additionalProperties: true,
  properties: {
    chirpMass: nullable({
      type: "object",
      properties: {
        detectorFrame: valueWithSd("chirp mass, detector frame, solar masses"),
        sourceFrame: nullable(valueWithSd("chirp mass, source frame = detector frame / (1 + z), solar masses")),
      },
    }),
    chirpMassError: reason("chirpMass"),
    coalescenceTime: nullable(num("fitted coalescence time, seconds relative to eventTime")),
    coalescenceTimeSd: nullable(num("one standard deviation of coalescenceTime, seconds")),
    secondsToMerger: nullable(num("coalescenceTime minus (receipt − eventTime), seconds; negative: merged before receipt")),
    classProbabilities: nullable({
      type: "object",
      description: "source-class probabilities from component-mass samples; they sum to 1",
      properties: { bns: num("neutron-star pair"), nsbh: num("neutron star–black hole"), bbh: num("black-hole pair"), lowerGap: num("a component in the lower mass gap") },
    }),
    classSampleCount: { type: "integer", description: "samples drawn for the probabilities" },
    classProbabilitiesSe: nullable({ type: "object", description: "binomial Monte Carlo standard error √(p(1−p)/N) of each class probability" }),
    astroProbability: nullable({
      type: "object",
      description:
        "probability of astrophysical origin (two-component Poisson mixture, FGMC 2015; ρ⁻⁴ foreground, terrestrial density ρ·FAR); byClass = pAstro × class probabilities",
      properties: { pAstro: num("probability of astrophysical origin"), pTerrestrial: num("1 − pAstro"), byClass: { type: ["object", "null"] } },
    }),
    astroProbabilityError: reason("astroProbability"),
    remnantMatter: nullable({ type: "object", description: "FHN 2018 Eq. 4 remnant-mass fraction for the mean masses, with the neutron-star radius and black-hole spin assumed" }),
    fit: nullable({
      type: "object",
      description:
        "fit diagnostics: model (pn-3.5 = 3.5PN TaylorT4 with the trigger's mass ratio; leading-order), massRatio, shapeCheck (a failed check leaves chirpMass null with track-not-chirp-like), warnings",
    }),
    pNeutronStar: nullable(num("probability that at least one component is a neutron star")),
    pRemnantMatter: nullable(num("probability that matter remains outside the final black hole")),
    mergerFrequency: nullable({
      type: "object",
      description: "detector-frame merger frequencies",
      properties: {
        iscoHz: num("GW frequency at the Schwarzschild ISCO of the total mass, Hz"),
        iscoKerrHz: num("GW frequency at the Kerr ISCO of the remnant for its signed final spin (prograde orbit for finalSpin ≥ 0, retrograde for finalSpin < 0), Hz"),
        ringdownHz: nullable(num("dominant quasinormal-mode frequency, Hz")),
        ringdownDampingTimeS: nullable(num("its damping time, s")),
        finalMass: { type: "object", description: "remnant mass, solar masses, by frame" },
        finalSpin: num("dimensionless remnant spin"),
      },
    }),
    redshift: nullable(valueWithSd("cosmological redshift from the luminosity distance (flat ΛCDM, Planck 2018)")),
    redshiftAssumed: { type: "boolean", description: "true when no distance was given and z = 0 was assumed" },
  },
};

export const ingestAnswerSchema: JsonSchema = {
  type: "object",
  required: ["id", "triggerId", "preferred", "revision", "derived", "outcome"],
  properties: {
    id: { type: "string", description: "Chirpdesk's candidate id: the same for every trigger of one signal" },
    triggerId: { type: "string", description: "Chirpdesk's id of this trigger (source, externalId) within the candidate" },
    preferred: { type: "boolean", description: "whether this trigger now speaks for the candidate (its preferred trigger)" },
    revision: { type: "integer", description: "the revision this answer is about (the one posted)" },
    derived: { $ref: "#/components/schemas/Derived" },
    outcome: {
      type: "string",
      enum: ["created", "joined", "revised", "stale", "duplicate"],
      description:
        "created: new candidate (201); joined: a new trigger whose event time is within the coincidence window of a " +
        "live candidate's trigger, grouped into it (201); revised: now this trigger's current revision (201); stale: " +
        "lower than this trigger's current revision, kept in the history only (201); duplicate: this revision was " +
        "stored before, nothing written (200)",
    },
  },
};

export const errorSchema: JsonSchema = {
  type: "object",
  required: ["error", "requestId"],
  properties: {
    error: { type: "string" },
    requestId: { type: "string" },
    issues: {
      type: "array",
      description: "every field at fault (422)",
      items: { type: "object", properties: { path: { type: "string" }, message: { type: "string" } } },
    },
    deadLetterId: { type: "string", description: "where the refused body was kept (400 and 422 from the feed route)" },
  },
};

const person: JsonSchema = nullable({
  type: "object",
  properties: { id: { type: "string" }, name: { type: "string" }, initials: { type: "string" } },
});
const instant: JsonSchema = { type: "string", format: "date-time" };

export const candidateDetailSchema: JsonSchema = {
  type: "object",
  required: ["id", "revision", "derived", "state", "revisions", "tasks", "payload"],
  properties: {
    id: { type: "string" },
    revision: { type: "integer", description: "the current revision" },
    derived: { $ref: "#/components/schemas/Derived" },
    source: { type: "string" },
    externalId: { type: "string" },
    state: {
      type: "object",
      properties: {
        triageState: { type: "string", enum: ["new", "acknowledged", "reviewing", "pursue", "dismissed", "expert"] },
        stage: { type: "string", enum: ["early-warning", "first-look", "confirmed", "revised", "withdrawn"] },
        owner: person,
        acknowledgedAt: nullable(instant),
        acknowledgedBy: person,
        decidedAt: nullable(instant),
        dismissReason: { type: ["string", "null"] },
        withdrawnAt: nullable(instant),
        eventTime: instant,
        receivedAt: instant,
        updatedAt: instant,
        version: { type: "integer", description: "bumped on every write (optimistic concurrency)" },
      },
    },
    headline: { type: "object", description: "the current revision's headline numbers" },
    revisions: {
      type: "array",
      description: "every revision in revision order; `changes` lists headline fields that differ from the previous one",
      items: {
        type: "object",
        properties: {
          revision: { type: "integer" },
          stage: { type: "string" },
          eventTime: instant,
          receivedAt: instant,
          isCurrent: { type: "boolean" },
          arrivedLate: { type: "boolean", description: "a higher revision had arrived first" },
          headline: { type: "object" },
          changes: {
            type: "array",
            items: { type: "object", properties: { field: { type: "string" }, from: {}, to: {} } },
          },
        },
      },
    },
    tasks: { type: "array", items: { type: "object", description: "follow-up tasks with site and claimant" } },
    payload: { $ref: "#/components/schemas/FeedCandidate" },
  },
};
