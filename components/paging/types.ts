import type { Delivery, FailedNotification, MyNotification } from "@/lib/data/paging";
import type { DeviceView } from "@/lib/notify/devices";
import type { PreferencesView } from "@/lib/notify/preferences";

export type { Delivery, DeviceView, FailedNotification, MyNotification, PreferencesView };

export interface NotificationListResponse {
  items: MyNotification[];
  unread: number;
  me: { id: string; timeZone: string };
}
