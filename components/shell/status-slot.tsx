"use client";

import { LiveIndicator } from "@/components/live/live-indicator";
import { NotificationBell } from "@/components/paging/notification-bell";

/** Header status area: the live-connection indicator (boards) and the notification bell (paging). */
export function StatusSlot() {
  return (
    <>
      <LiveIndicator />
      <NotificationBell />
    </>
  );
}
