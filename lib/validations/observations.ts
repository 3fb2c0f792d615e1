import { z } from "zod";
import { footprintSchema } from "./instruments";

/** Longest exposure we accept (a day); a start more than an hour ahead of the server's clock is a typo, not a plan. */
export const MAX_EXPOSURE_S = 86_400;
export const MAX_FUTURE_MS = 3_600_000;
export const MAX_JSON_ROWS = 1000;
export const MAX_CSV_ROWS = 10_000;

/** One logged exposure as a client sends it; the footprint defaults to the instrument's, the instrument to the task's. */
export const observationRowSchema = z
  .object({
    raDeg: z.number().finite().min(0, "at least 0°").lt(360, "below 360°"),
    decDeg: z.number().finite().min(-90, "at least −90°").max(90, "at most 90°"),
    instrumentId: z.string().trim().min(1, "must not be empty").max(64).optional(),
    footprint: footprintSchema.optional(),
    startTime: z.iso.datetime({ offset: true, message: "an ISO 8601 time with a zone, e.g. 2026-12-04T05:10:00Z" }),
    exposureS: z.number().finite().gt(0, "above 0 s").max(MAX_EXPOSURE_S, "at most 86 400 s (a day)"),
    filter: z.string().trim().min(1, "must not be empty").max(20, "at most 20 characters"),
    limitingMagnitude: z.number().finite().min(-5, "at least −5").max(35, "at most 35").optional(),
    pointingIndex: z.number().int("a whole number").min(0, "at least 0").optional(),
  })
  .strict();
export type ObservationRow = z.output<typeof observationRowSchema>;

export const observationsBodySchema = z
  .object({ observations: z.array(z.unknown()).min(1, "give at least one observation").max(MAX_JSON_ROWS, "at most 1000 observations per request") })
  .strict();

/** A refused row: its 1-based position in the request (or file data row) and the field at fault. */
export interface RowProblem {
  row: number;
  field: string;
  message: string;
}

export type RowsCheck = { ok: true; rows: ObservationRow[] } | { ok: false; problem: RowProblem };

/**
 * Checks every row and answers the first problem (rows in order, then fields); nothing is stored unless all pass.
 * `now` is the server's clock (injected): a start more than an hour after it is refused.
 */
export function checkObservationRows(input: readonly unknown[], now: Date): RowsCheck {
  const rows: ObservationRow[] = [];
  for (const [index, value] of input.entries()) {
    const parsed = observationRowSchema.safeParse(value);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      const field = issue?.path.map(String).join(".") || (issue?.code === "unrecognized_keys" ? issue.keys.join(", ") : "row");
      return { ok: false, problem: { row: index + 1, field, message: issue?.message ?? "invalid" } };
    }
    if (Date.parse(parsed.data.startTime) - now.getTime() > MAX_FUTURE_MS) {
      return { ok: false, problem: { row: index + 1, field: "startTime", message: "more than 1 h in the future" } };
    }
    rows.push(parsed.data);
  }
  return { ok: true, rows };
}
