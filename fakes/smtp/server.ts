// A local SMTP server that accepts every message (any AUTH or none, plain text, no TLS), keeps it
// parsed in memory, serves it as JSON over HTTP, and can be switched into an outage.
import { randomUUID } from "node:crypto";
import type { AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";
import type { SMTPServerAddress } from "smtp-server";
import { startInboxHttp } from "./inbox-http";
import { mailJson, toStoredMail } from "./stored-mail";
import type { StoredMail } from "./stored-mail";

export type { StoredMail, StoredMailJson } from "./stored-mail";

/**
 * `reply-421`: connections are accepted but answered `421` (RFC 5321 Section 3.8, service not available —
 * a temporary failure the sender retries). `refuse-connections`: the port stops listening (ECONNREFUSED).
 * In both modes sessions already open get 421 on their next MAIL FROM.
 */
export type OutageMode = "reply-421" | "refuse-connections";

export interface FakeSmtpOptions {
  /** 0 (default) picks a free port. */
  smtpPort?: number;
  /** 0 (default) picks a free port. */
  httpPort?: number;
  /** Default 127.0.0.1. */
  host?: string;
  /** Clock for receivedAt; defaults to Date.now. */
  now?: () => number;
}

export interface MailFilter {
  /** Only messages received strictly after this instant (epoch ms). */
  sinceMs?: number;
  afterSeq?: number;
  /** Only messages whose envelope recipients include this address (case-insensitive). */
  to?: string;
}

export interface FakeSmtp {
  smtpPort: number;
  host: string;
  /** Origin of the JSON inbox API: GET/DELETE /messages, GET /messages/:id, GET/PUT /outage. */
  httpUrl: string;
  messages(filter?: MailFilter): StoredMail[];
  /** Messages whose Message-ID arrived before: a sender's repeat of one message (after a crash), not a new one. */
  repeats(): StoredMail[];
  clear(): void;
  /** Resolves once the outage state is in effect (for `refuse-connections`, once the port is closed or listening again). */
  setDown(down: boolean, options?: { mode?: OutageMode }): Promise<void>;
  isDown(): boolean;
  onMessage(listener: (mail: StoredMail) => void): () => void;
  waitForMessages(count: number, options?: MailFilter & { timeoutMs?: number }): Promise<StoredMail[]>;
  close(): Promise<void>;
}

const temporaryFailure = (): Error =>
  Object.assign(new Error("Service not available, try again later (fake outage)"), { responseCode: 421 });

const address = (a: SMTPServerAddress | false): string | null => (a === false ? null : a.address);

export async function startFakeSmtp(options: FakeSmtpOptions = {}): Promise<FakeSmtp> {
  const host = options.host ?? "127.0.0.1";
  const now = options.now ?? Date.now;
  let stored: StoredMail[] = [];
  let nextSeq = 1;
  let down = false;
  const listeners = new Set<(mail: StoredMail) => void>();

  const smtp = new SMTPServer({
    name: "fake-smtp.chirpdesk.test",
    banner: "Chirpdesk local mail catcher",
    secure: false,
    disabledCommands: ["STARTTLS"],
    authOptional: true,
    allowInsecureAuth: true, // AUTH over plain text is fine on localhost; there is no TLS to upgrade to
    logger: false,
    size: 10 * 1024 * 1024,
    closeTimeout: 500,
    disableReverseLookup: true, // no DNS round trip per connection; the client is always local
    onConnect: (_session, callback) => callback(down ? temporaryFailure() : undefined),
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? "anonymous" }),
    onMailFrom: (_address, _session, callback) => callback(down ? temporaryFailure() : undefined),
    onData: (stream, session, callback) => {
      simpleParser(stream)
        .then((parsed) => {
          // An outage that began mid-transaction still refuses it, so the sender retries the whole message.
          if (down) return callback(temporaryFailure());
          const mail = toStoredMail(parsed, {
            id: randomUUID(),
            seq: nextSeq++,
            envelope: {
              mailFrom: address(session.envelope.mailFrom),
              rcptTo: session.envelope.rcptTo.map((r) => r.address),
            },
            authUser: typeof session.user === "string" ? session.user : null,
            sizeBytes: stream.byteLength,
            receivedAt: new Date(now()),
          });
          stored.push(mail);
          for (const listener of listeners) listener(mail);
          callback(null, `Queued as ${mail.id}`);
        })
        .catch((error: unknown) => callback(error instanceof Error ? error : new Error(String(error))));
    },
  });

  // Client resets and similar connection faults are the sender's business; keep serving.
  smtp.on("error", () => undefined);

  const listen = (port: number) =>
    new Promise<number>((resolve, reject) => {
      smtp.server.once("error", reject);
      smtp.server.listen(port, host, () => {
        smtp.server.off("error", reject);
        resolve((smtp.server.address() as AddressInfo).port);
      });
    });
  const smtpPort = await listen(options.smtpPort ?? 0);

  const messages = (filter: MailFilter = {}): StoredMail[] =>
    stored.filter(
      (m) =>
        (filter.sinceMs === undefined || m.receivedAt.getTime() > filter.sinceMs) &&
        (filter.afterSeq === undefined || m.seq > filter.afterSeq) &&
        (filter.to === undefined || m.envelope.rcptTo.some((r) => r.toLowerCase() === filter.to?.toLowerCase())),
    );

  let listening = true;
  const setDown = async (next: boolean, opts: { mode?: OutageMode } = {}): Promise<void> => {
    down = next;
    if (next && opts.mode === "refuse-connections" && listening) {
      listening = false;
      await new Promise<void>((resolve) => smtp.server.close(() => resolve()));
    } else if (!next && !listening) {
      await listen(smtpPort);
      listening = true;
    }
  };

  const fake: Omit<FakeSmtp, "httpUrl"> = {
    smtpPort,
    host,
    messages,
    repeats: () => stored.filter((m, i) => m.messageId !== null && stored.findIndex((o) => o.messageId === m.messageId) < i),
    clear: () => {
      stored = [];
    },
    setDown,
    isDown: () => down,
    onMessage: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    waitForMessages: (count, opts = {}) => {
      const { timeoutMs = 10_000, ...filter } = opts;
      return new Promise((resolve, reject) => {
        const check = () => {
          const found = messages(filter);
          if (found.length < count) return;
          clearTimeout(timer);
          listeners.delete(check);
          resolve(found);
        };
        const timer = setTimeout(() => {
          listeners.delete(check);
          reject(new Error(`fake smtp: ${messages(filter).length} of ${count} messages after ${timeoutMs} ms`));
        }, timeoutMs);
        listeners.add(check);
        check();
      });
    },
    close: async () => {
      await Promise.all([new Promise<void>((resolve) => smtp.close(() => resolve())), http.close()]);
    },
  };
  const http = await startInboxHttp(fake, { port: options.httpPort ?? 0, host, toJson: mailJson });
  return { ...fake, httpUrl: http.url };
}
