import { catalogueColumns, MAX_CATALOGUE_ROWS } from "@/lib/validations/catalogues";

/** OpenAPI entries of the galaxy-catalogue and galaxy-ranking routes (hand-written; the query checks are zod's). */

type JsonSchema = Record<string, unknown>;
const json = (ref: string) => ({ "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } });
const failure = (description: string) => ({ description, content: json("Error") });
const idParam = { name: "id", in: "path", required: true, schema: { type: "string" } };
const num = (description: string): JsonSchema => ({ type: "number", description });

const catalogueSchema: JsonSchema = {
  type: "object",
  required: ["id", "name", "state", "isDefault", "rows", "uploadedById", "createdAt"],
  properties: {
    id: { type: "string" },
    name: { type: "string" },
    state: { enum: ["importing", "ready"], description: "importing while an upload streams in; only ready ones are ranked" },
    isDefault: { type: "boolean", description: "the catalogue ranked when none is named (at most one)" },
    rows: { type: "integer", description: "galaxies stored (so far, while importing)" },
    uploadedById: { type: ["string", "null"] },
    createdAt: { type: "string" },
  },
};

const targetSchema: JsonSchema = {
  type: "object",
  required: ["name", "raDeg", "decDeg", "distanceMpc", "weight", "score", "normalizedScore", "cumulativeScore", "bestWindow"],
  properties: {
    name: { type: "string" },
    raDeg: num("J2000 right ascension"),
    decDeg: num("J2000 declination"),
    distanceMpc: num("the catalogue's distance"),
    weight: num("the catalogue's luminosity or mass proxy"),
    score: num("ρ(n) · DISTNORM(n) · N(r; DISTMU(n), DISTSIGMA(n)) · weight, per steradian per Mpc³ (Singer et al. 2016 ansatz)"),
    normalizedScore: num("score over the sum for every catalogue galaxy in the credible region"),
    cumulativeScore: num("normalizedScore summed down the list, this galaxy included"),
    bestWindow: {
      oneOf: [{ type: "object", required: ["start", "end"], properties: { start: { type: "string" }, end: { type: "string" } } }, { type: "null" }],
      description: "with siteId: the longest stretch of the site's coming astronomical night with the galaxy above the site's altitude limit",
    },
  },
};

const targetsSchema: JsonSchema = {
  type: "object",
  description: "Rapid triage estimates; official parameter estimates and local observatory safety rules take precedence.",
  required: ["skymapId", "catalogueId", "credibleLevel", "consideredRows", "galaxies"],
  properties: {
    skymapId: { type: "string", description: "the candidate's newest sky map" },
    catalogueId: { type: "string" },
    credibleLevel: num("the greedy credible region whose galaxies were scored"),
    consideredRows: { type: "integer", description: "catalogue galaxies inside that region" },
    galaxies: { type: "array", items: { $ref: "#/components/schemas/GalaxyTarget" } },
  },
};

export function galaxyPaths() {
  return {
    "/api/v1/catalogues": {
      get: {
        summary: "Galaxy catalogues, newest first",
        description: "Roles: shifter, observer, coordinator, admin.",
        responses: { "200": { description: "{ catalogues: Catalogue[] }" }, "401": failure("not signed in") },
      },
      post: {
        summary: "Upload a galaxy catalogue (CSV, streamed)",
        description:
          `multipart/form-data: the CSV in field "file" (header ${catalogueColumns.join(",")}; weight may be left out, then 1), ` +
          `optional field "name". At most ${MAX_CATALOGUE_ROWS} rows. Rows are checked and stored as the body arrives; a refusal keeps ` +
          "nothing. The first catalogue becomes the default. Role: coordinator.",
        requestBody: { required: true, content: { "multipart/form-data": { schema: { type: "object", required: ["file"], properties: { file: { type: "string", format: "binary" }, name: { type: "string" } } } } } },
        responses: {
          "201": { description: "{ id, name, rows }" },
          "400": failure("a broken multipart body"),
          "401": failure("not signed in"),
          "403": failure("role not allowed"),
          "413": failure("over the row or byte limit"),
          "415": failure("not multipart/form-data"),
          "422": failure("a bad row (row and column named), header, name, or no file"),
        },
      },
    },
    "/api/v1/catalogues/{id}": {
      get: {
        summary: "One catalogue",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [idParam],
        responses: { "200": { description: "{ catalogue }", content: json("Catalogue") }, "401": failure("not signed in"), "404": failure("no such catalogue") },
      },
      patch: {
        summary: "Rename a catalogue or make it the default",
        description: 'Body { "name"?: string, "isDefault"?: true }. Role: coordinator.',
        parameters: [idParam],
        responses: { "200": { description: "{ catalogue }" }, "403": failure("role not allowed"), "404": failure("no such catalogue"), "409": failure("still importing"), "422": failure("nothing to change or a bad field") },
      },
      delete: {
        summary: "Delete a catalogue and its galaxies",
        description: "The newest remaining ready catalogue becomes the default when this one was. Role: coordinator.",
        parameters: [idParam],
        responses: { "200": { description: "{ deleted: true, newDefaultId }" }, "403": failure("role not allowed"), "404": failure("no such catalogue") },
      },
    },
    "/api/v1/candidates/{id}/galaxies": {
      get: {
        summary: "Galaxies ranked as hosts in the candidate's newest 3D sky map",
        description: "Roles: shifter, observer, coordinator, admin.",
        parameters: [
          idParam,
          { name: "catalogueId", in: "query", required: false, schema: { type: "string" }, description: "the default catalogue when absent" },
          { name: "limit", in: "query", required: false, schema: { type: "integer", minimum: 1, maximum: 1000, default: 100 } },
          { name: "siteId", in: "query", required: false, schema: { type: "string" }, description: "adds each galaxy's best window tonight" },
          { name: "level", in: "query", required: false, schema: { type: "number", minimum: 0.5, maximum: 0.999, default: 0.99 } },
        ],
        responses: {
          "200": { description: "the ranking", content: json("GalaxyTargets") },
          "401": failure("not signed in"),
          "404": failure("no such candidate or sky map, catalogue or site"),
          "409": failure("the map has no distance columns, or the catalogue is still importing"),
          "422": failure("a query value out of range"),
        },
      },
    },
  };
}

export function galaxySchemas(): Record<string, JsonSchema> {
  return { Catalogue: catalogueSchema, GalaxyTarget: targetSchema, GalaxyTargets: targetsSchema };
}
