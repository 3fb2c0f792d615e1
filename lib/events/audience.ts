import type { AppEvent } from "@/db/schema";
import { can, hasRole, type SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "./kinds";

/**
 * Who may see an event on the live stream. Most of the log is the shared picture of the run; changes to people and
 * settings are for those who manage them, and a failed page is for coordinators and the person it failed to reach.
 */
export function mayReceive(user: Pick<SessionUser, "id" | "role">, event: Pick<AppEvent, "kind" | "data">): boolean {
  switch (event.kind) {
    case eventKinds.userChanged:
      return hasRole(user, can.manageUsers);
    case eventKinds.settingsChanged:
      return hasRole(user, can.manageSettings);
    case eventKinds.notificationFailed:
    case eventKinds.pageFailing:
      return hasRole(user, can.readDeliveryFailures) || event.data?.userId === user.id;
    default:
      return true;
  }
}
