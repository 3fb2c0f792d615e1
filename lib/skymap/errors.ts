/** What went wrong with an uploaded sky map; every code maps to a 4xx for the route on top. */
export type SkymapErrorCode =
  | "too-large"
  | "bad-gzip"
  | "not-fits"
  | "truncated"
  | "bad-header"
  | "no-table"
  | "unsupported-column"
  | "unsupported-layout"
  | "bad-ordering"
  | "bad-nside"
  | "bad-uniq"
  | "missing-column"
  | "non-finite"
  | "negative"
  | "zero-total"
  | "bad-grid"
  | "bad-query";

export class SkymapError extends Error {
  readonly code: SkymapErrorCode;

  constructor(code: SkymapErrorCode, message: string) {
    super(message);
    this.name = "SkymapError";
    this.code = code;
  }

  /** Plain form for JSON answers and logs. */
  toJSON(): { code: SkymapErrorCode; message: string } {
    return { code: this.code, message: this.message };
  }
}
