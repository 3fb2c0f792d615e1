"use client";

import { LiveIndicator } from "@/components/live/live-indicator";

/** Header status area: the live-connection indicator (boards) and the notification bell (paging) mount here. */
export function StatusSlot() {
  return <LiveIndicator />;
}
