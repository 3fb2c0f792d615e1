"use client";

import { useQueryClient } from "@tanstack/react-query";
import { CloudOff, Loader2, Radio, RefreshCw, Timer, type LucideIcon } from "lucide-react";
import { useEffect } from "react";
import { cn } from "@/components/ui/cn";
import { acquireLiveConnection } from "./live-connection";
import { subscribeLiveEvents, useLiveStatus, type LiveStatus } from "./live-store";
import { keysForEvent, queryKeys, type QueryKey } from "./query-keys";

const look: Record<LiveStatus, { label: string; icon: LucideIcon; tone: string; title: string }> = {
  connecting: { label: "Connecting", icon: Loader2, tone: "text-muted", title: "Opening the live update stream" },
  live: { label: "Live", icon: Radio, tone: "text-ok", title: "Changes appear as they happen" },
  reconnecting: { label: "Reconnecting", icon: RefreshCw, tone: "text-warn", title: "The live stream dropped; reconnecting without losing events" },
  polling: { label: "Polling", icon: Timer, tone: "text-warn", title: "The live stream is unavailable; checking for changes every 5 s" },
  offline: { label: "Offline", icon: CloudOff, tone: "text-alarm", title: "Cannot reach the server; what you see may be out of date" },
};

/** Waits this long to gather a burst of events into one refetch per query. */
const INVALIDATE_DEBOUNCE_MS = 250;

/**
 * The header's live-connection indicator. Mounting it opens the tab's one event stream and turns events into
 * TanStack Query invalidations, so every screen under it stays current.
 */
export function LiveIndicator() {
  const status = useLiveStatus();
  const queryClient = useQueryClient();

  useEffect(() => {
    const pending = new Map<string, QueryKey>();
    let timer: ReturnType<typeof setTimeout> | undefined;
    const flush = () => {
      for (const queryKey of pending.values()) void queryClient.invalidateQueries({ queryKey }, { cancelRefetch: false });
      pending.clear();
    };
    const queue = (keys: QueryKey[]) => {
      for (const key of keys) pending.set(JSON.stringify(key), key);
      clearTimeout(timer);
      timer = setTimeout(flush, INVALIDATE_DEBOUNCE_MS);
    };
    const unsubscribe = subscribeLiveEvents((event) => queue(keysForEvent(event)));
    // On (re)open, whatever happened between the page load and the stream is refetched once.
    const release = acquireLiveConnection(() => queue([queryKeys.board, queryKeys.tasks, queryKeys.roster, queryKeys.candidates]));
    return () => {
      clearTimeout(timer);
      unsubscribe();
      release();
    };
  }, [queryClient]);

  const { label, icon: Icon, tone, title } = look[status];
  return (
    <span
      role="status"
      aria-live="polite"
      title={title}
      data-testid="live-status"
      data-status={status}
      className={cn("mr-1 inline-flex items-center gap-1.5 rounded-md border border-line px-2 py-1 text-xs font-medium", tone)}
    >
      <Icon aria-hidden className={cn("h-3.5 w-3.5", (status === "connecting" || status === "reconnecting") && "animate-spin")} />
      {label}
    </span>
  );
}
