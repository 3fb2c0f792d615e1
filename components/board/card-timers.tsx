"use client";

import { Clock, Siren, TriangleAlert, Zap } from "lucide-react";
import { cn } from "@/components/ui/cn";
import { formatAge, formatCountdown, formatDuration } from "@/lib/format/duration";
import { ackLevel, secondsToMerger, type AckDeadlines } from "@/lib/triage/ack-level";
import { useNow } from "./use-now";

const ackLook = {
  waiting: { icon: Clock, text: "Waiting", tone: "text-muted" },
  warn: { icon: TriangleAlert, text: "Acknowledge soon", tone: "text-warn" },
  alarm: { icon: Siren, text: "Overdue", tone: "text-alarm font-semibold" },
} as const;

/** Time since receipt of an unacknowledged candidate: icon, words and colour change at each deadline. */
export function AckTimer({
  receivedAt,
  deadlines,
}: {
  receivedAt: number;
  deadlines: AckDeadlines;
}) {
  const now = useNow();
  if (now === null) return <span className="text-xs text-faint">Unacknowledged</span>;
  const elapsedS = (now - receivedAt) / 1000;
  const level = ackLevel(elapsedS, deadlines);
  const { icon: Icon, text, tone } = ackLook[level];
  return (
    <span className={cn("inline-flex items-center gap-1 text-xs tabular-nums", tone)} data-ack-level={level}>
      <Icon aria-hidden className="h-3.5 w-3.5" />
      {text} · {formatDuration(elapsedS)}
    </span>
  );
}

/**
 * Live countdown to the expected merger of an early warning: the fitted coalescence time (seconds after eventTime)
 * minus the time since eventTime (as lib/physics secondsToMergerAt; repeated in lib/triage to keep physics out of
 * the board bundle).
 */
export function MergerCountdown({ eventTime, coalescenceTimeS }: { eventTime: number; coalescenceTimeS: number | null }) {
  const now = useNow();
  if (now === null) return <span className="text-xs text-faint">Merger time pending</span>;
  const seconds = secondsToMerger(coalescenceTimeS, eventTime, now);
  return (
    <span className={cn("inline-flex items-center gap-1 text-xs tabular-nums", seconds > 0 ? "text-warn font-semibold" : "text-muted")}>
      <Zap aria-hidden className="h-3.5 w-3.5" />
      {formatCountdown(seconds)}
    </span>
  );
}

export function Age({ since }: { since: number }) {
  const now = useNow();
  return <>{now === null ? "" : formatAge((now - since) / 1000)}</>;
}
