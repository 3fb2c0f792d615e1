import { z } from "zod";
import { sourceClasses, stages, triageStates } from "@/db/schema/candidate-values";

export const candidateSortKeys = [
  "receivedAt",
  "eventTime",
  "falseAlarmRatePerYear",
  "networkSnr",
  "chirpMassDetectorFrame",
  "externalId",
  "triageState",
] as const;
export type CandidateSortKey = (typeof candidateSortKeys)[number];

/** Several values of a filter arrive comma-separated in one query parameter ("state=new,reviewing"). */
const csvOf = <T extends readonly [string, ...string[]]>(values: T) =>
  z
    .string()
    .optional()
    .transform((raw) => (raw ? raw.split(",").filter(Boolean) : []))
    .pipe(z.array(z.enum(values)));

/** GET /api/v1/candidates: server-side sort, filter and pagination; the same keys live in the page URL. */
export const candidateListQuerySchema = z.object({
  sort: z.enum(candidateSortKeys).default("receivedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(5).max(200).default(25),
  state: csvOf(triageStates),
  stage: csvOf(stages),
  class: csvOf(sourceClasses),
  q: z.string().trim().max(100).optional(),
});
export type CandidateListQuery = z.infer<typeof candidateListQuerySchema>;

/** POST /api/v1/candidates/:id/notes */
export const noteBodySchema = z.strictObject({
  body: z.string().trim().min(1, "write something first").max(5000),
});
export type NoteBody = z.infer<typeof noteBodySchema>;

/** `POST /api/v1/candidates/{id}/merge`: the candidate to merge into this one (by Chirpdesk id). */
export const mergeBodySchema = z.strictObject({
  candidateId: z.string().trim().min(1).max(64),
});
