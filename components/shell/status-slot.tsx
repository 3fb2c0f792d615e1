"use client";

/** Header status area: the live-connection indicator and the notification bell mount here. */
export function StatusSlot() {
  return null;
}
