import { DrizzleQueryError } from "drizzle-orm/errors";

/**
 * An error as it may be written to a log. Drizzle's query errors carry the statement's parameter values in their
 * message and fields, and those values include password bcrypt hashes and API-token hashes: keep the statement and
 * the driver's error (code and message), never the values.
 */
export function loggableError(error: unknown): unknown {
  if (!(error instanceof DrizzleQueryError)) return error;
  const safe = new Error(`Failed query: ${error.query}\n(parameter values withheld from the log)`);
  safe.name = "DrizzleQueryError";
  // The original stack begins with the original (multi-line) message: keep only its frames.
  const frames = (error.stack ?? "").split("\n").filter((line) => /^\s+at /.test(line));
  safe.stack = [`${safe.name}: ${safe.message}`, ...frames].join("\n");
  if (error.cause !== undefined) safe.cause = loggableError(error.cause);
  return safe;
}

/** One line for a log: the safe error's message (see loggableError). */
export function loggableMessage(error: unknown): string {
  const safe = loggableError(error);
  return safe instanceof Error ? safe.message : String(safe);
}
