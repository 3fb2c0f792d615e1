import { z } from "zod";
import { counterpartBodySchema } from "@/lib/validations/counterparts";
import { MAX_CSV_ROWS, MAX_JSON_ROWS, observationRowSchema } from "@/lib/validations/observations";
import { csvColumns } from "@/lib/validations/observations-csv";

/** OpenAPI entries of the observation log, coverage and counterpart routes: requests from zod, answers hand-written. */

type JsonSchema = Record<string, unknown>;
const json = (ref: string) => ({ "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } });
const failure = (description: string) => ({ description, content: json("Error") });
const idParam = { name: "id", in: "path", required: true, schema: { type: "string" } };
const num = (description: string): JsonSchema => ({ type: "number", description });
const orNull = (type: string, description: string): JsonSchema => ({ type: [type, "null"], description });
const caution = "Rapid triage estimates; official parameter estimates and local observatory safety rules take precedence.";
const rowRefusal = failure("a row at fault: { error, row, field } (row 0 is the file or its header); nothing of the request is stored");

const coverageSchema: JsonSchema = {
  type: "object",
  description: caution,
  required: ["skymapId", "coveredProbability", "coveredAreaDeg2", "observations", "curve", "bySite"],
  properties: {
    skymapId: { type: "string", description: "the candidate's newest sky map, on which coverage is measured" },
    coveredProbability: num("probability inside the union of every logged footprint (overlaps once; pixel centres inside)"),
    coveredAreaDeg2: num("area of that union"),
    observations: { type: "integer" },
    curve: {
      type: "array",
      description: "one point per exposure at its end, in time order; never falls",
      items: { type: "object", required: ["time", "secondsSinceMerger", "coveredProbability"], properties: { time: { type: "string" }, secondsSinceMerger: num("seconds"), coveredProbability: num("union of every exposure ended by then") } },
    },
    bySite: {
      type: "array",
      items: { type: "object", required: ["siteId", "coveredProbability", "firstObservationAt"], properties: { siteId: orNull("string", "null for exposures of no site"), coveredProbability: num("that site's own union"), firstObservationAt: { type: "string" } } },
    },
  },
};

const counterpartSchema: JsonSchema = {
  type: "object",
  description: caution,
  required: ["id", "candidateId", "raDeg", "decDeg", "observedAt", "notes", "skymapId", "searchedProbability", "searchedAreaDeg2", "probabilityDensityPerDeg2", "warning"],
  properties: {
    id: { type: "string" },
    candidateId: { type: "string" },
    raDeg: num("J2000"),
    decDeg: num("J2000"),
    observedAt: { type: "string" },
    magnitude: orNull("number", "AB or as reported"),
    magnitudeError: orNull("number", ""),
    filter: orNull("string", ""),
    name: orNull("string", ""),
    notes: { type: "string" },
    skymapId: orNull("string", "the map the three figures are computed on; null without a sky map"),
    searchedProbability: orNull("number", "probability of every pixel at least as dense as the one holding the position"),
    searchedAreaDeg2: orNull("number", "area of that region"),
    probabilityDensityPerDeg2: orNull("number", "density of the pixel holding the position"),
    warning: orNull("string", "outside the 99.9 % region (kept anyway), or no sky map yet"),
  },
  additionalProperties: true,
};

export function observationPaths() {
  return {
    "/api/v1/tasks/{id}/observations": {
      get: {
        summary: "A task's logged exposures, oldest start first",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: { "200": { description: "{ observations: [...] }" }, "401": failure("not signed in"), "404": failure("no such task") },
      },
      post: {
        summary: "Log exposures for a task",
        description:
          `1–${MAX_JSON_ROWS} rows; the instrument defaults to the task's site's only one, the footprint to the instrument's. ` +
          "A start more than 1 h ahead, an exposure ≤ 0 s or over a day, a position off the sphere, an unknown instrument " +
          "or one of another site is refused by row and field. Roles: shifters and coordinators for any task; observers " +
          "for tasks they hold or with their own sites' instruments.",
        parameters: [idParam],
        requestBody: { required: true, content: json("ObservationsRequest") },
        responses: {
          "201": { description: "{ accepted, ids }: every row stored, in one transaction" },
          "401": failure("not signed in"),
          "403": failure("role not allowed, or an observer naming no instrument of their sites on a task they do not hold"),
          "404": failure("no such task"),
          "422": rowRefusal,
        },
      },
    },
    "/api/v1/tasks/{id}/observations/csv": {
      post: {
        summary: "Log exposures for a task from a CSV file",
        description: `The body as text/csv, or multipart/form-data with the file in field "file"; a header row, then at most ${MAX_CSV_ROWS} rows, columns ${Object.keys(csvColumns).join(", ")} (ra_deg, dec_deg, start_utc, exposure_s and filter required). The same rules and roles as the JSON route.`,
        parameters: [idParam],
        requestBody: { required: true, content: { "text/csv": { schema: { type: "string" } }, "multipart/form-data": { schema: { type: "object", properties: { file: { type: "string", format: "binary" } } } } } },
        responses: {
          "201": { description: "{ accepted, ids }" },
          "401": failure("not signed in"),
          "403": failure("role not allowed"),
          "404": failure("no such task"),
          "413": failure("the file is too large"),
          "415": failure("neither text/csv nor multipart"),
          "422": rowRefusal,
        },
      },
    },
    "/api/v1/candidates/{id}/observations": {
      get: {
        summary: "Every exposure logged for a candidate, with its resolved footprint",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: { "200": { description: "{ observations: [...] }" }, "401": failure("not signed in"), "404": failure("no such candidate") },
      },
    },
    "/api/v1/candidates/{id}/coverage": {
      get: {
        summary: "How much of the newest sky map has been observed, and when",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: {
          "200": { description: "the coverage", content: json("Coverage") },
          "401": failure("not signed in"),
          "404": failure("no such candidate"),
          "409": failure("the candidate has no sky map yet"),
        },
      },
    },
    "/api/v1/candidates/{id}/counterparts": {
      get: {
        summary: "The candidate's counterparts, first observed first, each ranked on the newest sky map",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: { "200": { description: "{ skymapId, counterparts: Counterpart[] }" }, "401": failure("not signed in"), "404": failure("no such candidate") },
      },
      post: {
        summary: "Report a transient found in follow-up",
        description: "Stored with an audit entry; a position outside the 99.9 % region is kept with a warning. Roles: shifter, observer, coordinator.",
        parameters: [idParam],
        requestBody: { required: true, content: json("CounterpartRequest") },
        responses: {
          "201": { description: "the stored row and its searched region", content: json("Counterpart") },
          "401": failure("not signed in"),
          "403": failure("role not allowed"),
          "404": failure("no such candidate"),
          "422": failure("a field at fault (position, a time without a zone or over 1 h ahead, an error without its magnitude)"),
        },
      },
    },
  };
}

export function observationSchemas(): Record<string, JsonSchema> {
  const schema = (s: z.ZodType) => {
    const { $schema: _dialect, ...rest } = z.toJSONSchema(s, { io: "input", unrepresentable: "any" }) as JsonSchema;
    return rest;
  };
  return {
    ObservationsRequest: {
      type: "object",
      required: ["observations"],
      additionalProperties: false,
      properties: { observations: { type: "array", minItems: 1, maxItems: MAX_JSON_ROWS, items: schema(observationRowSchema) } },
    },
    Coverage: coverageSchema,
    CounterpartRequest: schema(counterpartBodySchema),
    Counterpart: counterpartSchema,
  };
}
