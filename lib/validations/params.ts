import { z } from "zod";

/**
 * Path parameters. Ids are only checked for shape here (a well-formed id that names nothing is the storage
 * layer's 404), so a route never runs with a missing or absurd segment.
 */
const segment = z.string().min(1, "must not be empty").max(200, "must be at most 200 characters");

export const idParams = z.object({ id: segment });
export const shiftIdParams = z.object({ shiftId: segment });
export const reportIdParams = z.object({ reportId: segment });
/** The feed names a candidate by its own source and id (decoded by Next already). */
export const feedTargetParams = z.object({ source: segment, externalId: segment });
/** A one-click acknowledge token: `<id>.<expiry>.<mac>`; its signature is checked where it is spent. */
export const ackTokenParams = z.object({ token: z.string().min(1, "must not be empty").max(1000, "is too long") });
export const triggerParams = z.object({ id: segment, triggerId: segment });
