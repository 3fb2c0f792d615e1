// Talking to a fake push service that runs in another process (dev, e2e, the paging benchmark).
import type { messageJson, subscriptionJson } from "./admin-routes";
import { makeSubscriptionKeys } from "./decrypt";

export type FakePushMessageJson = ReturnType<typeof messageJson>;
export type FakePushSubscriptionJson = ReturnType<typeof subscriptionJson>;

/** A device as the app sees it after a browser subscribes, plus the private half for decrypting. */
export interface FakeDevice {
  subscriptionId: string;
  /** Same shape as `PushSubscription.toJSON()` in a browser. */
  subscription: { endpoint: string; expirationTime: null; keys: { p256dh: string; auth: string } };
  privateKey: string;
}

async function call<T>(url: string, init: RequestInit = {}): Promise<T> {
  const res = await fetch(url, {
    ...init,
    headers: init.body === undefined ? init.headers : { "content-type": "application/json", ...init.headers },
  });
  if (!res.ok) throw new Error(`fake push ${init.method ?? "GET"} ${url}: ${res.status} ${await res.text()}`);
  return (res.status === 204 ? undefined : await res.json()) as T;
}

/** Registers an endpoint with the fake and makes the keys a browser would, like PushManager.subscribe(). */
export async function createFakeDevice(pushUrl: string, options: { applicationServerKey?: string } = {}): Promise<FakeDevice> {
  const registered = await call<FakePushSubscriptionJson>(`${pushUrl}/_admin/subscriptions`, {
    method: "POST",
    body: JSON.stringify(options),
  });
  const keys = makeSubscriptionKeys();
  return {
    subscriptionId: registered.id,
    subscription: { endpoint: registered.endpoint, expirationTime: null, keys: keys.keys },
    privateKey: keys.privateKey,
  };
}

export function listFakePushMessages(
  pushUrl: string,
  filter: { since?: number | string; after?: number; subscription?: string } = {},
): Promise<FakePushMessageJson[]> {
  const query = new URLSearchParams();
  for (const [name, value] of Object.entries(filter)) if (value !== undefined) query.set(name, String(value));
  return call(`${pushUrl}/_admin/messages?${query.toString()}`);
}

export async function markFakeSubscriptionGone(pushUrl: string, subscriptionId: string): Promise<void> {
  await call(`${pushUrl}/_admin/subscriptions/${encodeURIComponent(subscriptionId)}/gone`, { method: "POST" });
}

export async function setFakePushDown(
  pushUrl: string,
  down: boolean,
  options: { status?: number; retryAfterSeconds?: number } = {},
): Promise<void> {
  await call(`${pushUrl}/_admin/outage`, { method: "PUT", body: JSON.stringify({ down, ...options }) });
}
