// The fake SMTP server driven by real nodemailer over real sockets: parsed storage, the JSON inbox
// API, and outages that a sender sees as temporary failures.
import nodemailer from "nodemailer";
import type SMTPTransport from "nodemailer/lib/smtp-transport";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { startFakeSmtp } from "@/fakes/smtp/server";
import type { FakeSmtp, StoredMailJson } from "@/fakes/smtp/server";

const clockStartMs = Date.UTC(2031, 2, 14, 3, 0, 0);
let clockMs = clockStartMs;
let fake: FakeSmtp;

function transport(extra: SMTPTransport.Options = {}) {
  return nodemailer.createTransport({
    host: fake.host,
    port: fake.smtpPort,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: 2_000,
    greetingTimeout: 2_000,
    ...extra,
  });
}

const page = (to: string, subject: string) => ({
  from: "Chirpdesk pager <pager@chirpdesk.test>",
  to,
  subject,
  text: `${subject}\nAcknowledge: http://localhost:3000/ack/abc`,
  html: `<p>${subject}</p><p><a href="http://localhost:3000/ack/abc">Acknowledge</a></p>`,
  headers: { "X-Chirpdesk-Event": "candidate-C-0042" },
});

beforeAll(async () => {
  fake = await startFakeSmtp({ now: () => clockMs });
});
afterAll(async () => {
  await fake.close();
});
beforeEach(async () => {
  clockMs = clockStartMs;
  await fake.setDown(false);
  fake.clear();
});

describe("fake SMTP server with nodemailer", () => {
  it("keeps a text + HTML message parsed, without AUTH", async () => {
    const info = await transport().sendMail(page("Ada Okafor <ada@observers.test>", "Candidate C-0042 at N1"));
    expect(info.accepted).toEqual(["ada@observers.test"]);
    const [mail] = fake.messages();
    expect(mail).toMatchObject({
      from: '"Chirpdesk pager" <pager@chirpdesk.test>',
      to: ["ada@observers.test"],
      envelope: { mailFrom: "pager@chirpdesk.test", rcptTo: ["ada@observers.test"] },
      subject: "Candidate C-0042 at N1",
      messageId: info.messageId,
      authUser: null,
    });
    expect(mail?.text).toContain("Acknowledge: http://localhost:3000/ack/abc");
    expect(mail?.html).toContain('<a href="http://localhost:3000/ack/abc">Acknowledge</a>');
    expect(mail?.headers["x-chirpdesk-event"]).toBe("candidate-C-0042");
    expect(mail?.headers["content-type"]).toMatch(/^multipart\/alternative/);
    expect(mail?.receivedAt.getTime()).toBe(clockStartMs);
  });

  it("accepts any AUTH credentials and records the user", async () => {
    await transport({ auth: { user: "worker", pass: "anything at all" } }).sendMail(page("bo@observers.test", "auth"));
    expect(fake.messages()[0]?.authUser).toBe("worker");
  });

  it("answers 421 during an outage, so the sender sees a temporary failure; a resend arrives once it is back", async () => {
    await fake.setDown(true);
    const failed = transport().sendMail(page("cy@observers.test", "during outage"));
    await expect(failed).rejects.toMatchObject({ responseCode: 421 });
    expect(fake.messages()).toHaveLength(0);

    await fake.setDown(false);
    await transport().sendMail(page("cy@observers.test", "during outage"));
    expect(fake.messages().map((m) => m.subject)).toEqual(["during outage"]);
  });

  it("refuses connections in the refuse-connections mode and listens again on the same port", async () => {
    const port = fake.smtpPort;
    await fake.setDown(true, { mode: "refuse-connections" });
    await expect(transport().sendMail(page("di@observers.test", "refused"))).rejects.toMatchObject({
      code: expect.stringMatching(/ESOCKET|ECONNECTION/),
    });
    await fake.setDown(false);
    await transport().sendMail(page("di@observers.test", "refused"));
    expect(fake.smtpPort).toBe(port);
    expect(fake.messages()).toHaveLength(1);
  });

  it("closes cleanly while its port is shut for an outage", async () => {
    const other = await startFakeSmtp();
    await other.setDown(true, { mode: "refuse-connections" });
    await expect(other.close()).resolves.toBeUndefined();
  });

  it("answers 421 at MAIL FROM to a pooled connection that was open when the outage began", async () => {
    const pooled = nodemailer.createTransport({ host: fake.host, port: fake.smtpPort, ignoreTLS: true, pool: true, maxConnections: 1 });
    try {
      await pooled.sendMail(page("ed@observers.test", "before"));
      await fake.setDown(true);
      await expect(pooled.sendMail(page("ed@observers.test", "while down"))).rejects.toMatchObject({ responseCode: 421 });
      await fake.setDown(false);
      await pooled.sendMail(page("ed@observers.test", "after"));
    } finally {
      pooled.close();
    }
    expect(fake.messages().map((m) => m.subject)).toEqual(["before", "after"]);
  });

  it("waitForMessages resolves per recipient", async () => {
    const waiting = fake.waitForMessages(1, { to: "FI@observers.test", timeoutMs: 5_000 });
    await transport().sendMail(page("other@observers.test", "not for fi"));
    await transport().sendMail(page("fi@observers.test", "for fi"));
    expect((await waiting).map((m) => m.subject)).toEqual(["for fi"]);
  });
});

describe("JSON inbox API", () => {
  const getJson = async <T>(path: string): Promise<{ status: number; json: T }> => {
    const res = await fetch(`${fake.httpUrl}${path}`);
    return { status: res.status, json: (await res.json()) as T };
  };

  it("lists, filters, fetches one, and clears messages", async () => {
    await transport().sendMail(page("ga@observers.test", "one"));
    clockMs += 60_000;
    await transport().sendMail(page("ha@observers.test", "two"));

    const all = await getJson<StoredMailJson[]>("/messages");
    expect(all.json.map((m) => m.subject)).toEqual(["one", "two"]);
    expect(all.json[1]?.receivedAt).toBe(new Date(clockStartMs + 60_000).toISOString());
    expect((await getJson<StoredMailJson[]>(`/messages?since=${clockStartMs}`)).json.map((m) => m.subject)).toEqual(["two"]);
    expect((await getJson<StoredMailJson[]>("/messages?to=ga@observers.test")).json.map((m) => m.subject)).toEqual(["one"]);
    expect((await getJson<StoredMailJson[]>(`/messages?after=${all.json[0]?.seq}`)).json.map((m) => m.subject)).toEqual(["two"]);
    expect((await getJson<unknown>("/messages?since=soon")).status).toBe(400);

    const one = await getJson<StoredMailJson>(`/messages/${all.json[0]?.id}`);
    expect(one.json.html).toContain("<p>one</p>");
    expect((await getJson<unknown>("/messages/nope")).status).toBe(404);

    expect((await fetch(`${fake.httpUrl}/messages`, { method: "DELETE" })).status).toBe(204);
    expect((await getJson<StoredMailJson[]>("/messages")).json).toEqual([]);
  });

  it("switches the outage over HTTP", async () => {
    const put = (body: unknown) =>
      fetch(`${fake.httpUrl}/outage`, { method: "PUT", body: JSON.stringify(body), headers: { "content-type": "application/json" } });
    expect((await put({ down: "yes" })).status).toBe(400);
    expect(await (await put({ down: true })).json()).toEqual({ down: true });
    await expect(transport().sendMail(page("ia@observers.test", "x"))).rejects.toMatchObject({ responseCode: 421 });
    expect(await (await put({ down: false })).json()).toEqual({ down: false });
    await transport().sendMail(page("ia@observers.test", "x"));
    expect(fake.messages()).toHaveLength(1);
  });
});
