import nodemailer from "nodemailer";

export interface OutgoingEmail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** our notification id, in a header, so a reader (or a test) can tell deliveries of one row apart */
  notificationId: string;
}

export type EmailAttempt = { ok: true; messageId: string } | { ok: false; permanent: boolean; code: number | null; error: string };

function responseCode(error: unknown): number | null {
  const code = typeof error === "object" && error !== null && "responseCode" in error ? (error as { responseCode: unknown }).responseCode : null;
  return typeof code === "number" ? code : null;
}

/** E-mail over SMTP (SMTP_URL) with nodemailer; a small connection pool keeps sends quick. */
export function createEmailSender(options: { smtpUrl: string; from: string; timeoutMs?: number }) {
  const timeout = options.timeoutMs ?? 15_000;
  const url = new URL(options.smtpUrl);
  const transport = nodemailer.createTransport({
    host: url.hostname,
    port: url.port ? Number(url.port) : url.protocol === "smtps:" ? 465 : 587,
    secure: url.protocol === "smtps:",
    ...(url.username ? { auth: { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } } : {}),
    pool: true,
    maxConnections: 4,
    connectionTimeout: timeout,
    greetingTimeout: timeout,
    socketTimeout: timeout,
  });
  return {
    async send(mail: OutgoingEmail): Promise<EmailAttempt> {
      try {
        const info = await transport.sendMail({
          from: options.from,
          to: mail.to,
          subject: mail.subject,
          text: mail.text,
          html: mail.html,
          headers: { "X-Chirpdesk-Notification": mail.notificationId },
          // One Message-ID per outbox row (RFC 5322 Section 3.6.4): a resend after a worker crash is the same
          // message, so a receiver (and the fake SMTP server) can tell a repeat from a second page.
          messageId: `<${mail.notificationId}@notification.chirpdesk.invalid>`,
        });
        return { ok: true, messageId: info.messageId };
      } catch (error) {
        const code = responseCode(error);
        // RFC 5321 Section 4.2.1: 5yz replies are permanent failures, 4yz transient; no reply (network) is transient.
        const permanent = code !== null && code >= 500 && code < 600;
        return { ok: false, permanent, code, error: error instanceof Error ? error.message : String(error) };
      }
    },
    close(): void {
      transport.close();
    },
  };
}

export type EmailSender = ReturnType<typeof createEmailSender>;
