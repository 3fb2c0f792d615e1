/* Chirpdesk service worker: shows pages sent by web push and handles their "Open" and "Acknowledge" actions.
   Payload (JSON): { id, title, body, url, candidateId, ackUrl, tag }. */

self.addEventListener("install", () => self.skipWaiting());
self.addEventListener("activate", (event) => event.waitUntil(self.clients.claim()));

self.addEventListener("push", (event) => {
  let data = {};
  try {
    data = event.data ? event.data.json() : {};
  } catch {
    data = { title: "Chirpdesk", body: event.data ? event.data.text() : "" };
  }
  const actions = [{ action: "open", title: "Open" }];
  if (data.ackUrl) actions.push({ action: "acknowledge", title: "Acknowledge" });
  event.waitUntil(
    self.registration.showNotification(data.title || "Chirpdesk", {
      body: data.body || "",
      tag: data.tag || undefined,
      renotify: Boolean(data.tag),
      requireInteraction: Boolean(data.ackUrl),
      icon: "/icon.svg",
      badge: "/icon.svg",
      data: { url: data.url || "/notifications", ackUrl: data.ackUrl || null },
      actions,
    }),
  );
});

async function focusOrOpen(url) {
  const target = new URL(url, self.location.origin).href;
  const windows = await self.clients.matchAll({ type: "window", includeUncontrolled: true });
  for (const client of windows) {
    if (client.url === target && "focus" in client) return client.focus();
  }
  for (const client of windows) {
    if ("navigate" in client && new URL(client.url).origin === self.location.origin) {
      await client.navigate(target);
      return client.focus();
    }
  }
  return self.clients.openWindow(target);
}

async function acknowledge(ackUrl, fallbackUrl) {
  try {
    const url = new URL(ackUrl, self.location.origin);
    url.searchParams.set("via", "push");
    const res = await fetch(url.href, { method: "POST", headers: { accept: "application/json" }, credentials: "omit" });
    const body = await res.json().catch(() => ({}));
    const title = res.ok
      ? body.status === "already"
        ? `Already acknowledged${body.acknowledgedBy ? ` by ${body.acknowledgedBy}` : ""}`
        : "Acknowledged — escalation stopped"
      : "Could not acknowledge";
    await self.registration.showNotification(title, {
      body: res.ok ? "Open Chirpdesk to triage the candidate." : body.error || `The server answered ${res.status}.`,
      tag: "chirpdesk-ack-result",
      data: { url: fallbackUrl, ackUrl: null },
    });
  } catch {
    // Offline: open the app so the person can acknowledge there.
    await focusOrOpen(fallbackUrl);
  }
}

self.addEventListener("notificationclick", (event) => {
  const { url, ackUrl } = event.notification.data || {};
  event.notification.close();
  if (event.action === "acknowledge" && ackUrl) {
    event.waitUntil(acknowledge(ackUrl, url || "/notifications"));
    return;
  }
  event.waitUntil(focusOrOpen(url || "/notifications"));
});
