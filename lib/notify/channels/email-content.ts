import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";

export interface EmailContentInput {
  recipientName: string;
  recipientTimeZone: string;
  title: string;
  body: string;
  /** link into the app (candidate or task) */
  url: string | null;
  ackPageUrl?: string;
  ackExpiresAt?: string;
}

const escapeHtml = (s: string) =>
  s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");

function localTime(iso: string, timeZone: string): string {
  try {
    return `${format(new TZDate(Date.parse(iso), timeZone), "yyyy-MM-dd HH:mm")} ${timeZone}`;
  } catch {
    return iso;
  }
}

/** Subject, plain text and HTML of a message; the acknowledge link opens a page with one button (link scanners only GET). */
export function renderEmail(input: EmailContentInput): { subject: string; text: string; html: string } {
  const expires = input.ackExpiresAt ? localTime(input.ackExpiresAt, input.recipientTimeZone) : null;
  const text = [
    `${input.recipientName},`,
    "",
    input.title,
    input.body,
    "",
    ...(input.ackPageUrl ? [`Acknowledge (one click, works once, until ${expires}):`, input.ackPageUrl, ""] : []),
    ...(input.url ? ["Open in Chirpdesk:", input.url, ""] : []),
    "— Chirpdesk pager",
  ].join("\n");
  const button = (href: string, label: string, primary: boolean) =>
    `<a href="${escapeHtml(href)}" style="display:inline-block;padding:10px 16px;margin:4px 8px 4px 0;border-radius:6px;text-decoration:none;font-weight:600;${
      primary ? "background:#3d7eff;color:#ffffff" : "border:1px solid #9aa4b2;color:#1b2330"
    }">${escapeHtml(label)}</a>`;
  const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1b2330;line-height:1.45">
<p>${escapeHtml(input.recipientName)},</p>
<h2 style="margin:0 0 6px;font-size:18px">${escapeHtml(input.title)}</h2>
<p style="margin:0 0 16px;white-space:pre-line">${escapeHtml(input.body)}</p>
<p>${input.ackPageUrl ? button(input.ackPageUrl, "Acknowledge", true) : ""}${input.url ? button(input.url, "Open in Chirpdesk", false) : ""}</p>
${expires ? `<p style="font-size:12px;color:#5b6573">The acknowledge link works once, until ${escapeHtml(expires)}.</p>` : ""}
<p style="font-size:12px;color:#5b6573">— Chirpdesk pager</p>
</body></html>`;
  return { subject: `[Chirpdesk] ${input.title}`, text, html };
}
