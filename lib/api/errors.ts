import type { ZodError } from "zod";

export interface FieldIssue {
  path: string;
  message: string;
}

/** A failure the client caused or may act on; becomes a JSON response with this status. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = "ApiError";
  }
}

export const unauthorized = (message = "sign in or send a bearer token") => new ApiError(401, message);
export const notFound = (what: string) => new ApiError(404, `${what} not found`);

/** Every field at fault, as "a.b.0.c: message". */
export function zodIssues(error: ZodError): FieldIssue[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join(".") || "(body)", message: i.message }));
}

export function invalid(error: ZodError, what = "request body"): ApiError {
  const issues = zodIssues(error);
  const first = issues[0];
  const summary = first ? `${first.path}: ${first.message}` : "invalid";
  return new ApiError(422, `invalid ${what}: ${summary}${issues.length > 1 ? ` (+${issues.length - 1} more)` : ""}`, {
    issues,
  });
}
