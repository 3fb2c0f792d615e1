// In-memory state of the fake push service: subscriptions, received messages and the outage switch.
import { randomBytes, randomUUID } from "node:crypto";

export type Urgency = "very-low" | "low" | "normal" | "high";

export interface FakePushSubscription {
  id: string;
  endpoint: string;
  /** Set for a restricted subscription (RFC 8292 Section 4): only this VAPID key may send. */
  applicationServerKey: string | null;
  gone: boolean;
  createdAt: Date;
}

export interface StoredPushMessage {
  id: string;
  /** Increasing from 1 in arrival order, never reused (not even after a reset); a cursor for `?after=`. */
  seq: number;
  subscriptionId: string;
  endpoint: string;
  /** The Location answered with the 201 (the push message resource, RFC 8030 Section 5). */
  location: string;
  /** The encrypted body exactly as received. */
  body: Buffer;
  ttlSeconds: number;
  contentEncoding: string | null;
  urgency: Urgency;
  topic: string | null;
  /** All request headers, lower-case names, as received. */
  headers: Record<string, string>;
  vapid: { publicKey: string; sub: string; exp: number };
  receivedAt: Date;
}

export interface OutageState {
  down: boolean;
  status: number;
  retryAfterSeconds: number | null;
}

export interface MessageFilter {
  subscriptionId?: string;
  /** Only messages received strictly after this instant (epoch ms). */
  sinceMs?: number;
  /** Only messages with seq greater than this. */
  afterSeq?: number;
}

type Listener = (message: StoredPushMessage) => void;

export class PushStore {
  private readonly subscriptions = new Map<string, FakePushSubscription>();
  private stored: StoredPushMessage[] = [];
  private nextSeq = 1;
  private readonly listeners = new Set<Listener>();
  outage: OutageState = { down: false, status: 503, retryAfterSeconds: null };

  constructor(private readonly now: () => number) {}

  register(origin: string, applicationServerKey: string | null): FakePushSubscription {
    // Opaque, unguessable ids, as vendors' endpoints are capability URLs (RFC 8030 Section 8.4).
    const id = randomBytes(18).toString("base64url");
    const subscription: FakePushSubscription = {
      id,
      endpoint: `${origin}/push/${id}`,
      applicationServerKey,
      gone: false,
      createdAt: new Date(this.now()),
    };
    this.subscriptions.set(id, subscription);
    return subscription;
  }

  subscription(id: string): FakePushSubscription | undefined {
    return this.subscriptions.get(id);
  }

  listSubscriptions(): FakePushSubscription[] {
    return [...this.subscriptions.values()];
  }

  /** Later pushes to it answer 410 Gone, as when a user unsubscribes or the browser drops it. */
  markGone(id: string): boolean {
    const subscription = this.subscriptions.get(id);
    if (!subscription) return false;
    subscription.gone = true;
    return true;
  }

  add(message: Omit<StoredPushMessage, "id" | "seq" | "location" | "receivedAt">, origin: string): StoredPushMessage {
    const id = randomUUID();
    const full: StoredPushMessage = {
      ...message,
      id,
      seq: this.nextSeq++,
      location: `${origin}/message/${id}`,
      receivedAt: new Date(this.now()),
    };
    this.stored.push(full);
    for (const listener of this.listeners) listener(full);
    return full;
  }

  messages(filter: MessageFilter = {}): StoredPushMessage[] {
    return this.stored.filter(
      (m) =>
        (filter.subscriptionId === undefined || m.subscriptionId === filter.subscriptionId) &&
        (filter.sinceMs === undefined || m.receivedAt.getTime() > filter.sinceMs) &&
        (filter.afterSeq === undefined || m.seq > filter.afterSeq),
    );
  }

  clearMessages(): void {
    this.stored = [];
  }

  reset(): void {
    this.stored = [];
    this.subscriptions.clear();
    this.outage = { down: false, status: 503, retryAfterSeconds: null };
  }

  onMessage(listener: Listener): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }
}
