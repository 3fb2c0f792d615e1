import { describe, expect, it } from "vitest";
import { dateInputIso, dateTimeInputIso, timeInput24 } from "@/components/ui/iso-inputs";
import { localInputToInstant } from "@/lib/notify/rota-form";
import { shiftFormSchema } from "@/lib/validations/rota";

const whole = (pattern: string) => new RegExp(`^(?:${pattern})$`);

describe("24-hour ISO text inputs instead of the browser's locale pickers", () => {
  it("take 24-hour times and ISO dates, and nothing in 12-hour or month-first form", () => {
    expect(["00:00", "09:05", "23:59"].every((t) => whole(timeInput24.pattern).test(t))).toBe(true);
    expect(["24:00", "9:05", "09:05 PM", "12:60"].some((t) => whole(timeInput24.pattern).test(t))).toBe(false);
    expect(whole(dateInputIso.pattern).test("2026-12-04")).toBe(true);
    expect(whole(dateInputIso.pattern).test("12/04/2026")).toBe(false);
    expect(["2026-12-04 21:30", "2026-12-04T21:30"].every((t) => whole(dateTimeInputIso.pattern).test(t))).toBe(true);
    expect(whole(dateTimeInputIso.pattern).test("12/04/2026, 09:30 PM")).toBe(false);
  });

  it("the shift form reads 'YYYY-MM-DD HH:mm' (or with a T) and refuses a 12-hour time naming the format", () => {
    const base = { primaryId: "p", backupId: "", notes: "" };
    const ok = shiftFormSchema.safeParse({ ...base, startsLocal: "2031-07-01 09:00", endsLocal: "2031-07-01T17:00" });
    expect(ok.success && [ok.data.startsLocal, ok.data.endsLocal]).toEqual(["2031-07-01T09:00", "2031-07-01T17:00"]);
    const bad = shiftFormSchema.safeParse({ ...base, startsLocal: "2031-07-01 9:00 PM", endsLocal: "2031-07-01 17:00" });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]?.message).toBe("a date and 24-hour time, YYYY-MM-DD HH:mm");
    // Berlin is UTC+2 in July (tz database): the space form is the same instant as the T form
    expect(localInputToInstant("2031-07-01 09:00", "Europe/Berlin").toISOString()).toBe("2031-07-01T07:00:00.000Z");
  });
});
