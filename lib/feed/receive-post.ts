import { ApiError, invalid, zodIssues, type FieldIssue } from "@/lib/api/errors";
import { decodeUtf8 } from "@/lib/api/request-input";
import { parseStrictJson } from "@/lib/api/strict-json";
import { recordDeadLetter } from "@/lib/data/dead-letters";
import { ingestCandidate } from "@/lib/services/ingest-trigger";
import { feedCandidateSchema, maxTrackSamples } from "@/lib/validations/feed";

export const maxFeedBodyBytes = 5 * 1024 * 1024;

export interface FeedAnswer {
  status: number;
  /** `{ id, triggerId, preferred, revision, derived, outcome }` as JSON text */
  json: string;
}

/**
 * A correctly signed feed post: JSON (400) → schema (422) → track length (422) → one transaction. Every refusal
 * is kept raw as a dead letter, and the refusal carries the dead letter's id. The body is not parsed by the route
 * wrapper because what it refuses must be kept as sent.
 */
export async function receiveFeedPost(rawBytes: Uint8Array, receivedAt: Date): Promise<FeedAnswer> {
  let rawBody: string;
  const refuse = async (status: number, reason: string, issues?: FieldIssue[]) => {
    const deadLetterId = await recordDeadLetter({ receivedAt, statusCode: status, reason, issues, rawBody });
    return new ApiError(status, reason, { ...(issues ? { issues } : {}), deadLetterId });
  };
  try {
    rawBody = decodeUtf8(rawBytes);
  } catch {
    // The signature held over these exact bytes; keep them exactly (base64, said in the reason) for the sender.
    rawBody = Buffer.from(rawBytes).toString("base64");
    throw await refuse(400, "body is not valid UTF-8 text (kept base64-encoded)");
  }
  let json: unknown;
  try {
    json = parseStrictJson(rawBody);
  } catch (error) {
    if (!(error instanceof ApiError)) throw error;
    const issues = error.details?.issues as FieldIssue[] | undefined;
    throw await refuse(error.status, error.message, issues);
  }
  const parsed = feedCandidateSchema.safeParse(json);
  if (!parsed.success) {
    const refusal = invalid(parsed.error, "feed body");
    throw await refuse(422, refusal.message, zodIssues(parsed.error));
  }
  const samples = parsed.data.frequencyTrack.t.length;
  if (samples > maxTrackSamples) {
    const issue = { path: "frequencyTrack.t", message: `has ${samples} samples; at most ${maxTrackSamples}` };
    throw await refuse(422, `invalid feed body: ${issue.path}: ${issue.message}`, [issue]);
  }
  // Validation only trims the two names; when it changed nothing the raw body is the payload's JSON already.
  const raw = json as { source?: unknown; externalId?: unknown };
  const unchanged = raw.source === parsed.data.source && raw.externalId === parsed.data.externalId;
  const result = await ingestCandidate(parsed.data, receivedAt, unchanged ? { payloadJson: rawBody } : {});
  // The derived quantities are already JSON text (as stored); splice them in rather than parse and re-serialise.
  const body =
    `{"id":${JSON.stringify(result.id)},"triggerId":${JSON.stringify(result.triggerId)},"preferred":${result.preferred},` +
    `"revision":${result.revision},"derived":${result.derivedJson},"outcome":"${result.outcome}"}`;
  return { status: result.status, json: body };
}
