import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";
import type { ShiftFormValues } from "@/lib/validations/rota";

/** "yyyy-MM-ddTHH:mm" read as wall-clock time in `timeZone` → the UTC instant. */
export function localInputToInstant(local: string, timeZone: string): Date {
  const m = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})$/.exec(local.trim());
  if (!m) throw new Error(`not a local date-time: ${local}`);
  const [, y, mo, d, h, mi] = m.map(Number) as [number, number, number, number, number, number];
  return new Date(new TZDate(y, mo - 1, d, h, mi, 0, 0, timeZone).getTime());
}

/** The UTC instant as the value of a datetime-local input in `timeZone`. */
export function instantToLocalInput(at: Date | number, timeZone: string): string {
  return format(new TZDate(typeof at === "number" ? at : at.getTime(), timeZone), "yyyy-MM-dd'T'HH:mm");
}

/** The form's values as the API body (ISO UTC instants). */
export function toShiftInput(values: ShiftFormValues, timeZone: string) {
  return {
    startsAt: localInputToInstant(values.startsLocal, timeZone).toISOString(),
    endsAt: localInputToInstant(values.endsLocal, timeZone).toISOString(),
    primaryId: values.primaryId,
    backupId: values.backupId === "" ? null : values.backupId,
    notes: values.notes,
  };
}
