/** The `since` and `after` query parameters both fakes' inbox APIs take. */
export interface SinceAfter {
  sinceMs?: number;
  afterSeq?: number;
}

/** `since` is epoch milliseconds or an ISO 8601 instant; `after` a message seq. A string is the error to answer. */
export function parseSinceAfter(query: URLSearchParams): SinceAfter | string {
  const filter: SinceAfter = {};
  const since = query.get("since");
  if (since !== null) {
    const sinceMs = /^\d+$/.test(since) ? Number(since) : Date.parse(since);
    if (Number.isNaN(sinceMs)) return "since must be epoch milliseconds or an ISO 8601 time";
    filter.sinceMs = sinceMs;
  }
  const after = query.get("after");
  if (after !== null) {
    if (!/^\d+$/.test(after)) return "after must be a message seq";
    filter.afterSeq = Number(after);
  }
  return filter;
}
