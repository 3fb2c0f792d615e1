import { CircleCheck, CircleX, Inbox, ShieldCheck } from "lucide-react";
import Link from "next/link";
import { formatInZone } from "@/lib/format/time";
import { acknowledgeButtonLabel, acknowledgedText } from "@/lib/notify/ack-copy";
import { describeAckLink } from "@/lib/notify/acknowledge";
import { candidateFacts } from "@/lib/notify/content";
import { ackConfirmPath, candidatePath } from "@/lib/notify/links";

export const metadata = { title: "Acknowledge", robots: { index: false, follow: false }, referrer: "no-referrer" as const };
export const dynamic = "force-dynamic";

/**
 * The one-click acknowledge link's landing page. Opening it (GET) only shows what it would do, so mail link
 * scanners and previews that fetch links cannot acknowledge; the button POSTs (see ./confirm/route.ts).
 */
export default async function AckPage({ params, searchParams }: { params: Promise<{ token: string }>; searchParams: Promise<{ done?: string }> }) {
  const { token } = await params;
  const { done } = await searchParams;
  const state = await describeAckLink(decodeURIComponent(token), new Date(), done === "1");
  return (
    <main className="flex min-h-dvh items-center justify-center p-4">
      <div className="w-full max-w-md rounded-lg border border-line bg-surface p-6 shadow-xl" data-testid="ack-page" data-state={state.state}>
        <div className="mb-4 flex items-center gap-2">
          <Inbox aria-hidden className="h-5 w-5 text-accent" />
          <span className="font-semibold">Chirpdesk</span>
        </div>
        {state.state === "refused" ? (
          <>
            <h1 className="flex items-center gap-2 text-lg font-semibold text-alarm">
              <CircleX aria-hidden className="h-5 w-5" /> Link refused
            </h1>
            <p className="mt-2 text-sm" data-testid="ack-message">
              {state.message}
              {state.usedAt ? ` (used ${formatInZone(state.usedAt, "UTC")})` : ""}
            </p>
            <Link href="/triage" className="mt-4 inline-block text-sm text-accent">
              Open the triage board
            </Link>
          </>
        ) : (
          <>
            <h1 className="text-lg font-semibold">Candidate {state.candidate.externalId}</h1>
            <p className="mt-1 text-sm text-muted">{candidateFacts(state.candidate)}.</p>
            {state.state === "ready" ? (
              <form method="post" action={ackConfirmPath(decodeURIComponent(token))} className="mt-5 space-y-2">
                <button type="submit" className="inline-flex h-11 w-full items-center justify-center gap-2 rounded-md bg-accent font-semibold text-accent-fg hover:brightness-110" data-testid="ack-button">
                  <ShieldCheck aria-hidden className="h-5 w-5" /> {acknowledgeButtonLabel}
                </button>
                <p className="text-xs text-faint">
                  As {state.userName}. The link works once, until {formatInZone(state.expiresAt, state.timeZone)}.
                </p>
              </form>
            ) : (
              <p className="mt-5 flex items-start gap-2 text-sm" data-testid="ack-message">
                <CircleCheck aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-ok" />
                <span>{acknowledgedText(state)}</span>
              </p>
            )}
            <Link href={candidatePath(state.candidate.id)} className="mt-4 inline-block text-sm text-accent">
              Open the candidate in Chirpdesk
            </Link>
          </>
        )}
      </div>
    </main>
  );
}
