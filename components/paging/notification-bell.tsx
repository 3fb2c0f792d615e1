"use client";

import { Bell, BellRing } from "lucide-react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useRef, useState } from "react";
import { toast } from "sonner";
import { cn } from "@/components/ui/cn";
import type { MyNotification } from "./types";
import { useMarkNotificationsRead, useMyNotifications } from "./use-notifications";
import { ZonedTime } from "./zoned-time";

const pageKinds = new Set(["page", "escalation"]);

function pathOf(url: string | null): string {
  if (!url) return "/notifications";
  try {
    const u = new URL(url, window.location.origin);
    return u.pathname + u.search;
  } catch {
    return "/notifications";
  }
}

/** Toasts each unread message that arrives after the first load, so a person without push still sees a page at once. */
function useArrivalToasts(items: MyNotification[] | undefined, open: (n: MyNotification) => void) {
  const seen = useRef<Set<string> | null>(null);
  useEffect(() => {
    if (!items) return;
    if (seen.current === null) {
      seen.current = new Set(items.map((n) => n.id));
      return;
    }
    for (const n of [...items].reverse()) {
      if (seen.current.has(n.id)) continue;
      seen.current.add(n.id);
      if (n.readAt) continue;
      const show = pageKinds.has(n.kind) ? toast.warning : toast.info;
      show(n.title, { description: n.body, duration: pageKinds.has(n.kind) ? 30_000 : 8_000, action: { label: "Open", onClick: () => open(n) } });
    }
  }, [items, open]);
}

/** The header bell: unread count, the latest messages, toasts for new ones. Mount it in the header status slot. */
export function NotificationBell() {
  const { data } = useMyNotifications(8);
  const router = useRouter();
  const [openPanel, setOpenPanel] = useState(false);
  const wrapper = useRef<HTMLDivElement>(null);
  const markRead = useMarkNotificationsRead();
  const { mutate: mark } = markRead;
  const open = useCallback(
    (n: MyNotification) => {
      mark({ ids: [n.id] });
      router.push(pathOf(n.url));
    },
    [mark, router],
  );
  useArrivalToasts(data?.items, open);

  useEffect(() => {
    if (!openPanel) return;
    const onDown = (e: MouseEvent) => wrapper.current && !wrapper.current.contains(e.target as Node) && setOpenPanel(false);
    const onKey = (e: KeyboardEvent) => e.key === "Escape" && setOpenPanel(false);
    document.addEventListener("mousedown", onDown);
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("mousedown", onDown);
      document.removeEventListener("keydown", onKey);
    };
  }, [openPanel]);

  const unread = data?.unread ?? 0;
  const Icon = unread > 0 ? BellRing : Bell;
  return (
    <div ref={wrapper} className="relative">
      <button
        type="button"
        onClick={() => setOpenPanel((v) => !v)}
        aria-expanded={openPanel}
        aria-haspopup="dialog"
        aria-label={unread > 0 ? `Notifications, ${unread} unread` : "Notifications"}
        data-testid="notification-bell"
        data-unread={unread}
        className="relative rounded-md p-2 text-muted hover:bg-raised hover:text-fg"
      >
        <Icon aria-hidden className={cn("h-4 w-4", unread > 0 && "text-warn")} />
        {unread > 0 ? (
          <span className="absolute -right-0.5 -top-0.5 min-w-4 rounded-full bg-alarm px-1 text-center text-[10px] font-semibold leading-4 text-white">
            {unread > 99 ? "99+" : unread}
          </span>
        ) : null}
      </button>
      {openPanel ? (
        <div role="dialog" aria-label="Latest notifications" className="absolute right-0 top-10 z-50 w-96 max-w-[calc(100vw-1rem)] rounded-lg border border-line bg-surface shadow-2xl">
          <div className="flex items-center justify-between border-b border-line px-3 py-2">
            <span className="text-sm font-semibold">Call-outs</span>
            <button type="button" className="text-xs text-accent disabled:text-faint" disabled={unread === 0} onClick={() => markRead.mutate({ all: true })}>
              Mark all read
            </button>
          </div>
          <ul className="max-h-96 overflow-y-auto">
            {(data?.items ?? []).length === 0 ? <li className="px-3 py-6 text-center text-sm text-muted">Nothing yet. Pages about candidates and tasks appear here.</li> : null}
            {(data?.items ?? []).map((n) => (
              <li key={n.id} className="border-b border-line last:border-0">
                <button type="button" onClick={() => open(n)} className="block w-full px-3 py-2 text-left hover:bg-raised">
                  <span className="flex items-start gap-2">
                    <span aria-hidden className={cn("mt-1.5 h-2 w-2 shrink-0 rounded-full", n.readAt ? "bg-transparent" : pageKinds.has(n.kind) ? "bg-alarm" : "bg-accent")} />
                    <span className="min-w-0">
                      <span className="block truncate text-sm font-medium">{n.title}</span>
                      <span className="line-clamp-2 block text-xs text-muted">{n.body}</span>
                      <ZonedTime at={n.createdAt} timeZone={data?.me.timeZone ?? "UTC"} className="text-[11px] text-faint" />
                    </span>
                  </span>
                </button>
              </li>
            ))}
          </ul>
          <Link href="/notifications" onClick={() => setOpenPanel(false)} className="block border-t border-line px-3 py-2 text-center text-sm text-accent">
            All call-outs
          </Link>
        </div>
      ) : null}
    </div>
  );
}
