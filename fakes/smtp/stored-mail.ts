// The shape the fake SMTP server keeps for each accepted message, and its JSON form.
import type { AddressObject, ParsedMail } from "mailparser";

export interface StoredMail {
  id: string;
  /** Increasing from 1 in arrival order; a cursor for `?after=`. */
  seq: number;
  /** The From header as text, e.g. `Chirpdesk pager <pager@chirpdesk.test>`. */
  from: string;
  /** Addresses of the To header. */
  to: string[];
  /** SMTP envelope (MAIL FROM / RCPT TO), which is what actually routed the message. */
  envelope: { mailFrom: string | null; rcptTo: string[] };
  subject: string;
  text: string;
  html: string | null;
  /** Header name (lower case) → raw value; repeated headers joined with a newline. */
  headers: Record<string, string>;
  messageId: string | null;
  /** The AUTH user name if the client authenticated (any credentials are accepted). */
  authUser: string | null;
  sizeBytes: number;
  receivedAt: Date;
}

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = value === undefined ? [] : Array.isArray(value) ? value : [value];
  return list.flatMap((group) => group.value.map((a) => a.address ?? "")).filter((a) => a.length > 0);
}

function headerMap(parsed: ParsedMail): Record<string, string> {
  const out: Record<string, string> = {};
  for (const { key, line } of parsed.headerLines) {
    // A header line is `Name: value` with folding kept; drop the name, unfold the value.
    const value = line.slice(line.indexOf(":") + 1).replace(/\r?\n[ \t]+/g, " ").trim();
    out[key] = out[key] === undefined ? value : `${out[key]}\n${value}`;
  }
  return out;
}

export function toStoredMail(
  parsed: ParsedMail,
  meta: Pick<StoredMail, "id" | "seq" | "envelope" | "authUser" | "sizeBytes" | "receivedAt">,
): StoredMail {
  return {
    ...meta,
    from: parsed.from?.text ?? "",
    to: addresses(parsed.to),
    subject: parsed.subject ?? "",
    text: parsed.text ?? "",
    html: typeof parsed.html === "string" ? parsed.html : null,
    headers: headerMap(parsed),
    messageId: parsed.messageId ?? null,
  };
}

export function mailJson(mail: StoredMail) {
  return { ...mail, receivedAt: mail.receivedAt.toISOString() };
}

export type StoredMailJson = ReturnType<typeof mailJson>;
