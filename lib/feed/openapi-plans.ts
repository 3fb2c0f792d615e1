import { z } from "zod";
import { planCsvColumns } from "@/lib/plans/export";
import { maxPlanWindowHours, planRequestSchema } from "@/lib/validations/plans";

/** OpenAPI entries of the pointing-plan routes: the request schema from zod, the answer hand-written. */

type JsonSchema = Record<string, unknown>;
const json = (ref: string) => ({ "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } });
const failure = (description: string) => ({ description, content: json("Error") });
const idParam = { name: "id", in: "path", required: true, schema: { type: "string" } };
const num = (description: string): JsonSchema => ({ type: "number", description });
const orNull = (type: string, description: string): JsonSchema => ({ type: [type, "null"], description });

const footprintSchema: JsonSchema = {
  oneOf: [
    { type: "object", required: ["shape", "widthDeg", "heightDeg"], properties: { shape: { const: "rectangle" }, widthDeg: num("degrees, east–west"), heightDeg: num("degrees, north–south") } },
    { type: "object", required: ["shape", "radiusDeg"], properties: { shape: { const: "circle" }, radiusDeg: num("degrees") } },
  ],
};

const pointingSchema: JsonSchema = {
  type: "object",
  required: ["index", "raDeg", "decDeg", "probability", "gainedProbability", "cumulativeProbability", "plannedStart", "plannedEnd", "altitudeDeg", "airmass", "moonSeparationDeg", "unscheduledReason"],
  properties: {
    id: { type: "string" },
    index: { type: "integer", description: "1-based, in the order the planner chose the tiles" },
    raDeg: num("J2000 right ascension of the centre"),
    decDeg: num("J2000 declination of the centre"),
    probability: num("probability inside this footprint alone (pixel centres inside, at the map's own resolution)"),
    gainedProbability: num("what it adds to the pointings before it and the avoided sky (no double counting)"),
    cumulativeProbability: num("sum of gainedProbability up to this pointing"),
    plannedStart: orNull("string", "ISO 8601 UTC; null when it could not be scheduled"),
    plannedEnd: orNull("string", "ISO 8601 UTC"),
    altitudeDeg: orNull("number", "altitude at the planned start"),
    airmass: orNull("number", "1 / sin(altitude) at the planned start"),
    moonSeparationDeg: orNull("number", "distance from the Moon at the planned start"),
    unscheduledReason: { enum: ["not-observable-in-window", "too-close-to-moon", "no-time-left", null] },
    doneAt: orNull("string", "when an observer ticked it done"),
  },
};

const planSchema: JsonSchema = {
  type: "object",
  description: "Rapid triage estimates; official parameter estimates and local observatory safety rules take precedence.",
  required: ["id", "candidateId", "instrumentId", "skymapId", "level", "footprint", "window", "pointings", "totalProbability", "scheduledProbability"],
  properties: {
    id: { type: "string" },
    candidateId: { type: "string" },
    instrumentId: orNull("string", "null once the instrument is deleted (the plan keeps its copy of the footprint)"),
    skymapId: { type: "string" },
    level: num("credible level the plan aimed at"),
    footprint: { $ref: "#/components/schemas/Footprint" },
    window: { type: "object", required: ["start", "end"], properties: { start: { type: "string" }, end: { type: "string" } } },
    pointings: { type: "array", items: { $ref: "#/components/schemas/PlanPointing" } },
    totalProbability: num("probability of the union of all footprints"),
    scheduledProbability: num("probability of the union of the scheduled footprints"),
    avoidedProbability: num("probability already inside the avoided footprints"),
    taskId: orNull("string", "the follow-up task the plan belongs to"),
  },
  additionalProperties: true,
};

export function planPaths() {
  return {
    "/api/v1/candidates/{id}/plans": {
      get: {
        summary: "The candidate's pointing plans, newest first",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: { "200": { description: "{ plans: Plan[] }" }, "401": failure("not signed in"), "404": failure("no such candidate") },
      },
      post: {
        summary: "Plan pointings for one instrument over the candidate's newest sky map",
        description:
          "Greedy maximum coverage over candidate centres on a HEALPix grid finer than the footprint, then a schedule " +
          "at the instrument's site: inside the window, astronomical night, above the altitude limit for the whole " +
          "exposure, clear of the Moon; fields that set first go first. Defaults: level 0.9, as many pointings as reach " +
          `it (at most 500), the window from now to the end of the site's coming night (at most ${maxPlanWindowHours} h, any date), ` +
          "avoid planned-and-observed (sky in the candidate's other open plans does not count again). Roles: shifters and " +
          "coordinators for any site; observers for their own sites' instruments.",
        parameters: [idParam],
        requestBody: { required: true, content: json("PlanRequest") },
        responses: {
          "201": { description: "the stored plan", content: json("Plan") },
          "401": failure("not signed in"),
          "403": failure("role not allowed, or an observer planning another site's instrument"),
          "404": failure("no such candidate, instrument or task"),
          "409": failure("the candidate has no sky map, or the task is finished"),
          "422": failure("a field out of range (level 0.5–0.99, maxPointings 1–500, end after start, window ≤ 48 h, a filter the instrument has); every field at fault"),
        },
      },
    },
    "/api/v1/plans/{id}": {
      get: {
        summary: "One pointing plan",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: { "200": { description: "the plan", content: json("Plan") }, "401": failure("not signed in"), "404": failure("no such plan") },
      },
    },
    "/api/v1/plans/{id}/pointings/{pointingId}": {
      patch: {
        summary: "Tick a planned pointing done, or take the tick back",
        description: 'Body { "done": true | false }. Roles: observers at the plan\'s site or holding its task; coordinators.',
        parameters: [idParam, { name: "pointingId", in: "path", required: true, schema: { type: "string" } }],
        requestBody: { required: true, content: { "application/json": { schema: { type: "object", required: ["done"], properties: { done: { type: "boolean" } }, additionalProperties: false } } } },
        responses: {
          "200": { description: "{ pointing: PlanPointing }" },
          "401": failure("not signed in"),
          "403": failure("role not allowed, or an observer of another site"),
          "404": failure("no such pointing in this plan"),
          "409": failure("the plan was replaced or its task cancelled"),
          "422": failure("done is not a boolean"),
        },
      },
    },
    "/api/v1/plans/{id}/export": {
      get: {
        summary: "Download a plan",
        description: `format=csv (default; columns ${planCsvColumns.join(", ")}) or json. Times in UTC and in the site's own zone.`,
        parameters: [idParam, { name: "format", in: "query", required: false, schema: { enum: ["csv", "json"], default: "csv" } }],
        responses: {
          "200": { description: "the file", content: { "text/csv": { schema: { type: "string" } }, "application/json": { schema: { type: "object" } } } },
          "401": failure("not signed in"),
          "404": failure("no such plan"),
          "422": failure("an unknown format"),
        },
      },
    },
  };
}

export function planSchemas(): Record<string, JsonSchema> {
  const { $schema: _dialect, ...request } = z.toJSONSchema(planRequestSchema, { io: "input", unrepresentable: "any" }) as JsonSchema;
  return { PlanRequest: request, Plan: planSchema, PlanPointing: pointingSchema, Footprint: footprintSchema };
}
