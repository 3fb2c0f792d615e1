/** TanStack Query keys of the paging area. */
export const pagingKeys = {
  notifications: ["paging", "notifications"] as const,
  failed: ["paging", "failed"] as const,
  preferences: ["paging", "preferences"] as const,
  devices: ["paging", "devices"] as const,
  policy: ["paging", "escalation-policy"] as const,
  rota: (from: string, to: string) => ["paging", "rota", from, to] as const,
};

/** Event kinds after which the signed-in person's notification list may have changed. */
export const notificationEventKinds = new Set(["page.queued", "escalation.fired", "notification.failed", "page.failing", "candidate.triaged"]);
