import { getDb } from "@/db";
import type { Notification, PagingPreferences } from "@/db/schema";
import { devicesOfUser, forgetDevice, markDeviceReached } from "@/lib/data/devices";
import { candidateTriageState, readUserRow } from "@/lib/data/paging-people";
import { onCallPrimaryUntil } from "@/lib/data/rota";
import { PAGE_FAILING_ATTEMPTS, pageBackoff, retryDelayMs, type BackoffOptions } from "./backoff";
import { renderEmail } from "./channels/email-content";
import type { EmailSender } from "./channels/email";
import { topicFor, type PushSender } from "./channels/push";
import type { Outcome } from "./claim";
import { isWithinLocalWindow } from "./local-time";
import type { NotificationPayload } from "./outbox";
import { defaultPreferences, readPreferencesMany } from "./preferences";

export interface DeliveryContext {
  push: PushSender | null;
  email: EmailSender | null;
  now: Date;
  maxAttempts: number;
  backoff: BackoffOptions;
  random: () => number;
}

const pageKinds = new Set(["page", "escalation"]);

/** Whether the person's own switches and quiet hours hold this message back; null when it may go. */
export function muteReason(
  row: Pick<Notification, "kind" | "channel">,
  prefs: PagingPreferences,
  timeZone: string,
  now: Date,
): string | null {
  const channel = row.channel === "push" ? "push" : "email";
  const switches = row.kind.startsWith("task-") ? prefs.taskChannels : prefs;
  if (!switches[channel]) return `${channel} switched off in preferences`;
  if (prefs.quietStart && prefs.quietEnd && isWithinLocalWindow(now, timeZone, prefs.quietStart, prefs.quietEnd)) {
    return `quiet hours ${prefs.quietStart}–${prefs.quietEnd} ${timeZone}`;
  }
  return null;
}

/**
 * A transient failure. Pages (deliver() only gets this far while their candidate is still unanswered) retry until
 * delivered, acknowledged or decided, with backoff capped at 30 s, and at PAGE_FAILING_ATTEMPTS ask for the next
 * escalation step at once; other messages give up after the attempt limit.
 */
function retryOrFail(row: Notification, ctx: DeliveryContext, error: string, payload?: NotificationPayload): Outcome {
  const isPage = pageKinds.has(row.kind) && row.candidateId !== null;
  if (!isPage && row.attempts >= ctx.maxAttempts) return { status: "failed", error: `gave up after ${row.attempts} attempts: ${error}`, payload };
  const backoff = isPage ? { baseMs: Math.min(ctx.backoff.baseMs, pageBackoff.baseMs), capMs: Math.min(ctx.backoff.capMs, pageBackoff.capMs) } : ctx.backoff;
  const nextAttemptAt = new Date(ctx.now.getTime() + retryDelayMs(row.attempts, ctx.random(), backoff));
  return { status: "retry", error, nextAttemptAt, payload, escalateNow: isPage && row.attempts === PAGE_FAILING_ATTEMPTS };
}

/** Sends one leased row on its channel and says what became of it. Never throws for a channel's failure. */
export async function deliver(row: Notification, ctx: DeliveryContext): Promise<Outcome> {
  const db = await getDb();
  const payload: NotificationPayload = { tag: `n-${row.id}`, ...(row.payload as NotificationPayload | null) };
  if (row.attempts > ctx.maxAttempts && !pageKinds.has(row.kind)) return { status: "failed", error: `abandoned ${row.attempts - 1} times by crashed workers` };
  if (!row.userId) return { status: "failed", error: "row has no recipient" };
  const user = await readUserRow(db, row.userId);
  if (!user || user.disabledAt) return { status: "skipped", reason: "recipient is no longer active" };
  if (pageKinds.has(row.kind) && row.candidateId) {
    const state = await candidateTriageState(db, row.candidateId);
    if (state !== null && state !== "new") return { status: "skipped", reason: `acknowledged before delivery (${state})` };
  }
  // The on-call primary cannot mute pages during their shift.
  const onCall = pageKinds.has(row.kind) && (payload.onCall === true || (await onCallPrimaryUntil(db, user.id, ctx.now)) !== null);
  if (!onCall) {
    // Channels and quiet hours only: the batch reader skips the default task sites this does not need.
    const preferences = (await readPreferencesMany(db, [user.id])).get(user.id) ?? defaultPreferences();
    const muted = muteReason(row, preferences, user.timeZone, ctx.now);
    if (muted) return { status: "skipped", reason: muted };
  }
  return row.channel === "push" ? deliverPush(row, payload, ctx) : deliverEmail(row, payload, user, ctx);
}

async function deliverEmail(
  row: Notification,
  payload: NotificationPayload,
  user: { email: string; name: string; timeZone: string },
  ctx: DeliveryContext,
): Promise<Outcome> {
  if (!ctx.email) return retryOrFail(row, ctx, "no SMTP transport configured");
  const content = renderEmail({
    recipientName: user.name,
    recipientTimeZone: user.timeZone,
    title: row.title,
    body: row.body,
    url: row.url,
    ackPageUrl: payload.ackPageUrl,
    ackExpiresAt: payload.ackExpiresAt,
  });
  const result = await ctx.email.send({ to: user.email, ...content, notificationId: row.id });
  if (result.ok) return { status: "sent" };
  if (result.permanent) return { status: "failed", error: `SMTP refused (${result.code}): ${result.error}` };
  return retryOrFail(row, ctx, `SMTP: ${result.error}`);
}

async function deliverPush(row: Notification, payload: NotificationPayload, ctx: DeliveryContext): Promise<Outcome> {
  if (!ctx.push) return retryOrFail(row, ctx, "no VAPID keys configured");
  const devices = await devicesOfUser(row.userId ?? "");
  const already = new Set(payload.deliveredTo ?? []);
  const todo = devices.filter((d) => !already.has(d.id));
  if (devices.length === 0 || (todo.length === 0 && already.size === 0)) return { status: "skipped", reason: "no push device subscribed" };
  const message = JSON.stringify({
    id: row.id,
    title: row.title,
    body: row.body,
    url: row.url,
    candidateId: row.candidateId,
    ackUrl: payload.ackUrl ?? null,
    tag: payload.tag,
  });
  const transient: string[] = [];
  const permanent: string[] = [];
  let gone = 0;
  await Promise.all(
    todo.map(async (device) => {
      const attempt = await ctx.push?.send(device, message, { ttlSeconds: 3600, urgency: pageKinds.has(row.kind) ? "high" : "normal", topic: topicFor(row.candidateId) });
      if (!attempt) return;
      if (attempt.ok) {
        already.add(device.id);
        await markDeviceReached(device.id, ctx.now);
      } else if (attempt.gone) {
        gone += 1;
        await forgetDevice(device.id);
      } else (attempt.permanent ? permanent : transient).push(attempt.error);
    }),
  );
  const next: NotificationPayload = { ...payload, deliveredTo: [...already] };
  if (transient.length > 0) return retryOrFail(row, ctx, transient.join("; "), next);
  if (already.size > 0) return { status: "sent", payload: next };
  if (permanent.length > 0) return { status: "failed", error: permanent.join("; "), payload: next };
  return { status: "skipped", reason: `push device${gone === 1 ? "" : "s"} gone (404/410); subscription removed`, payload: next };
}
