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

/** A query parameter of the candidate page that was left out, and why, in words for the person who typed it. */
export interface IgnoredListParam {
  param: string;
  message: string;
}

const listParamMessages: Record<Exclude<keyof CandidateListQuery, "state" | "stage" | "class">, string> = {
  sort: `sort must be one of ${candidateSortKeys.join(", ")}`,
  dir: "dir must be asc or desc",
  page: "page must be a whole number from 1",
  pageSize: "pageSize must be a whole number from 5 to 200",
  q: "the search is at most 100 characters",
};

/**
 * The candidate page's address, read one parameter at a time: a parameter that does not parse falls back to its
 * default and is named in `ignored`, the others keep their values (a bad page number never drops the search).
 * Filters keep their known values and name the unknown ones. Unknown parameters are no concern of the list and
 * pass silently. (The API, GET /api/v1/candidates, stays strict: a bad parameter is a 422 naming it.)
 */
export function parseCandidateListParams(raw: Record<string, string | undefined>): { query: CandidateListQuery; ignored: IgnoredListParam[] } {
  const query: CandidateListQuery = candidateListQuerySchema.parse({});
  const ignored: IgnoredListParam[] = [];
  const shape = candidateListQuerySchema.shape;
  const scalar = <K extends keyof typeof listParamMessages>(key: K) => {
    const value = raw[key];
    if (value === undefined) return;
    const parsed = shape[key].safeParse(value);
    if (parsed.success) query[key] = parsed.data as CandidateListQuery[K];
    else ignored.push({ param: key, message: listParamMessages[key] });
  };
  scalar("sort");
  scalar("dir");
  scalar("page");
  scalar("pageSize");
  scalar("q");
  const filter = <K extends "state" | "stage" | "class">(key: K, allowed: readonly string[]) => {
    const value = raw[key];
    if (!value) return;
    const values = value.split(",").filter(Boolean);
    const known = values.filter((v) => allowed.includes(v));
    const unknown = values.filter((v) => !allowed.includes(v));
    query[key] = known as CandidateListQuery[K];
    if (unknown.length > 0) ignored.push({ param: key, message: `${key} has no value ${unknown.map((v) => `“${v}”`).join(", ")} (known: ${allowed.join(", ")})` });
  };
  filter("state", triageStates);
  filter("stage", stages);
  filter("class", sourceClasses);
  return { query, ignored };
}

/** POST /api/v1/candidates/:id/notes */
export const noteBodySchema = z.strictObject({
  body: z.string().trim().min(1, "write something first").max(5000),
});
export type NoteBody = z.infer<typeof noteBodySchema>;

/** `POST /api/v1/candidates/{id}/merge`: the candidate to merge into this one (by Chirpdesk id). */
export const mergeBodySchema = z.strictObject({
  candidateId: z.string().trim().min(1).max(64),
});
