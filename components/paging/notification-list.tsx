"use client";

import { useInfiniteQuery } from "@tanstack/react-query";
import { Bell, CheckCheck, ExternalLink } from "lucide-react";
import { useState } from "react";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { cn } from "@/components/ui/cn";
import { EmptyState } from "@/components/ui/empty-state";
import { apiFetch } from "@/lib/api-client";
import { DeliveryChips } from "./delivery-chips";
import { pagingKeys } from "./query-keys";
import type { NotificationListResponse } from "./types";
import { useMarkNotificationsRead, useMyNotifications } from "./use-notifications";
import { ZonedTime } from "./zoned-time";

const kindLabel: Record<string, { text: string; tone: "alarm" | "warn" | "accent" | "neutral" }> = {
  page: { text: "Page", tone: "alarm" },
  escalation: { text: "Escalation", tone: "alarm" },
  notice: { text: "Notice", tone: "neutral" },
  "task-created": { text: "Task", tone: "accent" },
  "task-cancelled": { text: "Task cancelled", tone: "warn" },
  test: { text: "Test", tone: "neutral" },
};

const PAGE_SIZE = 30;

/** Everything the person was paged about, newest first, with what push and e-mail did with each. */
export function NotificationList({ timeZone }: { timeZone: string }) {
  const [unreadOnly, setUnreadOnly] = useState(false);
  // The hook keeps the list fresh from live events and polling; the infinite query below reads the pages.
  useMyNotifications(8);
  const list = useInfiniteQuery({
    queryKey: [...pagingKeys.notifications, "list", unreadOnly],
    initialPageParam: 0,
    queryFn: ({ pageParam }) =>
      apiFetch<NotificationListResponse>(`/api/v1/notifications?limit=${PAGE_SIZE}${pageParam ? `&before=${pageParam}` : ""}${unreadOnly ? "&unread=1" : ""}`),
    getNextPageParam: (last) => (last.items.length < PAGE_SIZE ? undefined : Date.parse(last.items[last.items.length - 1]?.createdAt ?? "")),
    refetchInterval: 10_000,
  });
  const markRead = useMarkNotificationsRead();
  const items = list.data?.pages.flatMap((p) => p.items) ?? [];
  const unread = list.data?.pages[0]?.unread ?? 0;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <div role="group" aria-label="Show" className="inline-flex rounded-md border border-line p-0.5">
          {[false, true].map((only) => (
            <button
              key={String(only)}
              type="button"
              aria-pressed={unreadOnly === only}
              onClick={() => setUnreadOnly(only)}
              className={cn("rounded px-3 py-1 text-sm", unreadOnly === only ? "bg-raised font-medium" : "text-muted")}
            >
              {only ? `Unread (${unread})` : "All"}
            </button>
          ))}
        </div>
        <Button size="sm" variant="ghost" className="ml-auto" disabled={unread === 0 || markRead.isPending} onClick={() => markRead.mutate({ all: true })}>
          <CheckCheck aria-hidden className="h-4 w-4" /> Mark all read
        </Button>
      </div>
      {list.isPending ? <p className="text-sm text-muted">Loading…</p> : null}
      {list.isError ? <p role="alert" className="text-sm text-alarm">Could not load notifications: {list.error.message}</p> : null}
      {list.isSuccess && items.length === 0 ? (
        <EmptyState icon={Bell} title={unreadOnly ? "Nothing unread" : "No pages yet"}>
          When you are paged about a candidate or a task, it shows here at once, whether or not push or e-mail reached you.
        </EmptyState>
      ) : null}
      <ul className="divide-y divide-line overflow-hidden rounded-lg border border-line bg-surface" data-testid="notification-list">
        {items.map((n) => {
          const kind = kindLabel[n.kind] ?? { text: n.kind, tone: "neutral" as const };
          return (
            <li key={n.id} className={cn("flex flex-wrap items-start gap-3 px-4 py-3", !n.readAt && "bg-accent/5")}>
              <span aria-hidden className={cn("mt-2 h-2 w-2 shrink-0 rounded-full", n.readAt ? "bg-line" : "bg-accent")} />
              <div className="min-w-[14rem] flex-1 basis-0 space-y-1">
                <div className="flex flex-wrap items-center gap-2">
                  <Badge tone={kind.tone}>{kind.text}</Badge>
                  <span className="font-medium">{n.title}</span>
                  {!n.readAt ? <span className="sr-only">(unread)</span> : null}
                </div>
                <p className="text-sm text-muted">{n.body}</p>
                <div className="flex flex-wrap items-center gap-3 text-xs text-faint">
                  <ZonedTime at={n.createdAt} timeZone={timeZone} />
                  <DeliveryChips deliveries={n.deliveries} />
                </div>
              </div>
              <div className="ml-5 flex shrink-0 gap-1 sm:ml-0">
                {n.url ? (
                  <a href={n.url} onClick={() => !n.readAt && markRead.mutate({ ids: [n.id] })} className="inline-flex h-8 items-center gap-1 rounded-md border border-line px-2.5 text-sm hover:border-line-strong">
                    <ExternalLink aria-hidden className="h-3.5 w-3.5" /> Open
                  </a>
                ) : null}
                {!n.readAt ? (
                  <Button size="sm" variant="ghost" onClick={() => markRead.mutate({ ids: [n.id] })}>
                    Mark read
                  </Button>
                ) : null}
              </div>
            </li>
          );
        })}
      </ul>
      {list.hasNextPage ? (
        <Button variant="secondary" size="sm" onClick={() => void list.fetchNextPage()} disabled={list.isFetchingNextPage}>
          {list.isFetchingNextPage ? "Loading…" : "Older"}
        </Button>
      ) : null}
    </div>
  );
}
