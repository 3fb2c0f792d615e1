import { ApiError } from "@/lib/api/errors";
import { deleteDevice, listDeviceRows, upsertDevice, type DeviceRow } from "@/lib/data/devices";
import type { PushSubscribeInput } from "@/lib/validations/paging";

export interface DeviceView {
  id: string;
  label: string;
  /** the push service's host only; the endpoint itself is a capability URL and stays on the server */
  service: string;
  createdAt: string;
  lastSuccessAt: string | null;
}

const view = (row: DeviceRow): DeviceView => ({
  id: row.id,
  label: row.label,
  service: (() => {
    try {
      return new URL(row.endpoint).host;
    } catch {
      return "unknown";
    }
  })(),
  createdAt: row.createdAt.toISOString(),
  lastSuccessAt: row.lastSuccessAt?.toISOString() ?? null,
});

export async function listDevices(userId: string): Promise<DeviceView[]> {
  return (await listDeviceRows(userId)).map(view);
}

/** Stores this browser's subscription; an endpoint seen before (same browser, maybe another person) is taken over. */
export async function subscribeDevice(userId: string, input: PushSubscribeInput, now = new Date()): Promise<DeviceView> {
  return view(await upsertDevice({ userId, endpoint: input.endpoint, p256dh: input.keys.p256dh, auth: input.keys.auth, label: input.label }, now));
}

export async function removeDevice(userId: string, by: { id: string } | { endpoint: string }): Promise<void> {
  if ((await deleteDevice(userId, by)) === 0) throw new ApiError(404, "no such device of yours");
}
