import { createFeedIngestHandler } from "@/lib/feed/ingest-route";

// Authenticated by the feed's HMAC signature (X-Feed-Timestamp, X-Feed-Signature), not by a user session.
export const POST = createFeedIngestHandler();
