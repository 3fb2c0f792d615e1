import { z } from "zod";
import { feedCandidateSchema, maxTrackSamples } from "@/lib/validations/feed";
import { networkSiteCodes } from "./network";
import { galaxyPaths, galaxySchemas } from "./openapi-galaxies";
import { observationPaths, observationSchemas } from "./openapi-observations";
import { planPaths, planSchemas } from "./openapi-plans";
import { candidateDetailSchema, derivedSchema, errorSchema, ingestAnswerSchema } from "./openapi-schemas";
import { signatureToleranceSeconds } from "./signature";

const json = (ref: string) => ({ "application/json": { schema: { $ref: `#/components/schemas/${ref}` } } });
const failure = (description: string) => ({ description, content: json("Error") });

/** The OpenAPI 3.1 document of the feed and candidate API; the feed body schema comes from the zod schema itself. */
export function buildOpenApiDocument(serverUrl?: string) {
  const { $schema: _dialect, ...feedCandidate } = z.toJSONSchema(feedCandidateSchema) as Record<string, unknown>;
  return {
    openapi: "3.1.0",
    info: {
      title: "Chirpdesk API",
      version: "1",
      description:
        "The candidate feed, candidate reads, pointing plans, observation logs, coverage and counterparts. Detector site codes of the configured (fictional) network: " +
        `${networkSiteCodes().join(", ")}; any 1–4 character uppercase code is accepted.`,
    },
    ...(serverUrl ? { servers: [{ url: serverUrl }] } : {}),
    security: [{ bearer: [] }, { session: [] }],
    paths: {
      "/api/v1/feed/candidates": {
        post: {
          summary: "Post one revision of a candidate trigger",
          description:
            "Signed with HMAC-SHA256 over \"<X-Feed-Timestamp>.<raw body>\" using the feed signing secret; the " +
            `timestamp (Unix seconds) may be at most ${signatureToleranceSeconds} s from the server clock. Bodies over ` +
            `5 MB get 413; tracks over ${maxTrackSamples} samples get 422. Refusals after the signature check are kept ` +
            "as dead letters. (source, externalId, revision) is idempotent: a repeat answers the stored result (200), " +
            "whatever its body.",
          security: [],
          parameters: [
            { name: "X-Feed-Timestamp", in: "header", required: true, schema: { type: "string", pattern: "^\\d+$" } },
            {
              name: "X-Feed-Signature",
              in: "header",
              required: true,
              schema: { type: "string", pattern: "^sha256=[0-9a-f]{64}$" },
            },
          ],
          requestBody: { required: true, content: json("FeedCandidate") },
          responses: {
            "201": { description: "stored (created, revised or stale)", content: json("IngestAnswer") },
            "200": { description: "this revision was stored before; nothing written", content: json("IngestAnswer") },
            "400": failure("not JSON (dead-lettered)"),
            "401": failure("signature missing, wrong or stale (nothing kept)"),
            "413": failure("body over 5 MB (nothing kept)"),
            "422": failure("schema violation or track too long; every field path at fault (dead-lettered)"),
            "503": failure("database busy; retry after the Retry-After header"),
          },
        },
      },
      "/api/v1/feed/candidates/{source}/{externalId}/skymap": {
        post: {
          summary: "Attach a HEALPix sky map (FITS binary table) to a candidate the feed posted",
          description:
            "multipart/form-data with one file in the field \"file\": a flat RING/NESTED or multi-order (NUNIQ) HEALPix " +
            "map, optionally gzip-compressed, at most 200 MB. Signed like the candidate feed, but the HMAC covers the raw " +
            "body bytes: HMAC-SHA256 over \"<X-Feed-Timestamp>.\" followed by the body. The map is analysed (50 % and " +
            "90 % credible areas, peak) and stored for the candidate's current revision; a refused file leaves nothing behind.",
          security: [],
          parameters: [
            { name: "source", in: "path", required: true, schema: { type: "string" } },
            { name: "externalId", in: "path", required: true, schema: { type: "string" } },
            { name: "X-Feed-Timestamp", in: "header", required: true, schema: { type: "string", pattern: "^\\d+$" } },
            {
              name: "X-Feed-Signature",
              in: "header",
              required: true,
              schema: { type: "string", pattern: "^sha256=[0-9a-f]{64}$" },
            },
          ],
          requestBody: {
            required: true,
            content: {
              "multipart/form-data": {
                schema: { type: "object", required: ["file"], properties: { file: { type: "string", format: "binary" } } },
              },
            },
          },
          responses: {
            "201": { description: "stored and analysed; the answer names the stored map and its credible areas" },
            "401": failure("signature missing, wrong or stale"),
            "404": failure("no candidate with this source and externalId"),
            "413": failure("file over 200 MB"),
            "415": failure("not a FITS file"),
            "422": failure("not a HEALPix map this server reads, or no file field; the reason names the fault"),
          },
        },
      },
      "/api/v1/candidates/{id}": {
        get: {
          summary: "One candidate with state, revisions, tasks and the current payload",
          description: "Roles: shifter, observer, coordinator, admin.",
          parameters: [{ name: "id", in: "path", required: true, schema: { type: "string" } }],
          responses: {
            "200": { description: "the candidate", content: json("CandidateDetail") },
            "401": failure("not signed in"),
            "403": failure("role not allowed"),
            "404": failure("no such candidate"),
          },
        },
      },
      ...planPaths(),
      ...observationPaths(),
      ...galaxyPaths(),
      "/api/v1/openapi.json": {
        get: {
          summary: "This document",
          description: "Roles: shifter, observer, coordinator, admin.",
          responses: { "200": { description: "OpenAPI 3.1 document" }, "401": failure("not signed in") },
        },
      },
    },
    components: {
      securitySchemes: {
        bearer: { type: "http", scheme: "bearer", description: "a personal API token (cdk_…)" },
        session: { type: "apiKey", in: "cookie", name: "next-auth.session-token" },
      },
      schemas: {
        FeedCandidate: feedCandidate,
        Derived: derivedSchema,
        IngestAnswer: ingestAnswerSchema,
        CandidateDetail: candidateDetailSchema,
        Error: errorSchema,
        ...planSchemas(),
        ...observationSchemas(),
        ...galaxySchemas(),
      },
    },
  };
}
