"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useLiveEvents } from "@/components/live/live-store";
import { apiFetch } from "@/lib/api-client";
import { notificationEventKinds, pagingKeys } from "./query-keys";
import type { NotificationListResponse } from "./types";

/** Polling interval when the live stream says nothing (and the floor while it is down). */
const POLL_MS = 10_000;

/**
 * The signed-in person's latest notifications. Refreshed by live events that may concern them (a page queued
 * for them, an escalation, a failure) and every 10 s regardless, so a lost stream never hides a page.
 */
export function useMyNotifications(limit = 20) {
  const queryClient = useQueryClient();
  const query = useQuery({
    queryKey: [...pagingKeys.notifications, limit],
    queryFn: () => apiFetch<NotificationListResponse>(`/api/v1/notifications?limit=${limit}`),
    refetchInterval: POLL_MS,
    refetchIntervalInBackground: true,
  });
  const me = query.data?.me.id;
  useLiveEvents((event) => {
    if (!notificationEventKinds.has(event.kind)) return;
    const userIds = event.data?.userIds;
    if (event.kind === "page.queued" && Array.isArray(userIds) && me && !userIds.includes(me)) return;
    void queryClient.invalidateQueries({ queryKey: pagingKeys.notifications });
  });
  return query;
}

/** Marks some or all of the person's notifications read, then refreshes every notification list. */
export function useMarkNotificationsRead() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { ids: string[] } | { all: true }) => apiFetch<{ unread: number }>("/api/v1/notifications/read", { method: "POST", json: body }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: pagingKeys.notifications }),
  });
}
