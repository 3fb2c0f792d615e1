import { randomUUID } from "node:crypto";
import { ApiError, invalid, zodIssues, type FieldIssue } from "@/lib/api/errors";
import { errorResponse, readBodyText } from "@/lib/api/handler";
import { recordDeadLetter } from "@/lib/data/dead-letters";
import { ingestCandidate, isDatabaseBusy } from "@/lib/data/ingest";
import { feedCandidateSchema, maxTrackSamples } from "@/lib/validations/feed";
import { feedSigningSecret, verifyFeedSignature } from "./signature";

export const maxFeedBodyBytes = 5 * 1024 * 1024;

/**
 * A feed answer is never cached, and `no-transform` keeps the server from gzipping it: the answers are a few kB
 * for a machine on the same network, where compressing each one costs the server more than it saves.
 */
const answerHeaders = { "content-type": "application/json", "cache-control": "no-store, no-transform" };

export interface FeedRouteOptions {
  /** the receiver's clock, Unix ms (tests inject one) */
  now?: () => number;
  secret?: () => string;
}

/**
 * `POST /api/v1/feed/candidates`. Authenticated by the feed's HMAC signature, not by a user. Order of checks:
 * size (413) → signature (401, nothing kept) → JSON (400) → schema (422) → track length (422) → one transaction.
 * Every refusal after the signature is kept raw as a dead letter.
 */
export function createFeedIngestHandler(options: FeedRouteOptions = {}) {
  const now = options.now ?? Date.now;
  const secret = options.secret ?? (() => feedSigningSecret());
  return async (req: Request): Promise<Response> => {
    const requestId = randomUUID();
    try {
      const receivedMs = now();
      const rawBody = await readBodyText(req, maxFeedBodyBytes);
      const signature = verifyFeedSignature(secret(), req.headers, rawBody, receivedMs);
      if (!signature.ok) throw new ApiError(401, `feed signature refused: ${signature.reason}`);
      const receivedAt = new Date(receivedMs);
      /** Keeps the refused body and answers with the dead letter's id beside the reason. */
      const refuse = async (status: number, reason: string, issues?: FieldIssue[]) => {
        const deadLetterId = await recordDeadLetter({ receivedAt, statusCode: status, reason, issues, rawBody });
        return new ApiError(status, reason, { ...(issues ? { issues } : {}), deadLetterId });
      };
      let json: unknown;
      try {
        json = JSON.parse(rawBody);
      } catch (error) {
        throw await refuse(400, `body is not valid JSON: ${(error as Error).message}`);
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
      return new Response(body, { status: result.status, headers: answerHeaders });
    } catch (error) {
      if (isDatabaseBusy(error)) {
        return errorResponse(new ApiError(503, "the database is busy; retry shortly", { retryAfterSeconds: 1 }), requestId);
      }
      return errorResponse(error, requestId);
    }
  };
}
