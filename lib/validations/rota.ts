import { z } from "zod";

const maxShiftHours = 7 * 24;

function checkShift(s: { startsAt: Date; endsAt: Date; primaryId: string; backupId: string | null }, ctx: z.RefinementCtx) {
  if (s.endsAt.getTime() <= s.startsAt.getTime()) {
    ctx.addIssue({ code: "custom", path: ["endsAt"], message: "a shift must end after it starts" });
  } else if (s.endsAt.getTime() - s.startsAt.getTime() > maxShiftHours * 3_600_000) {
    ctx.addIssue({ code: "custom", path: ["endsAt"], message: `a shift may last at most ${maxShiftHours} hours` });
  }
  if (s.backupId !== null && s.backupId === s.primaryId) {
    ctx.addIssue({ code: "custom", path: ["backupId"], message: "the backup must be someone other than the primary" });
  }
}

const instant = z.iso.datetime({ offset: true }).transform((s) => new Date(s));

/** The API body for creating or replacing a shift: instants in ISO 8601 (stored as UTC). */
export const shiftInputSchema = z
  .object({
    startsAt: instant,
    endsAt: instant,
    primaryId: z.string().min(1, "choose a primary").max(64),
    backupId: z.string().max(64).nullable().transform((v) => (v === "" ? null : v)),
    notes: z.string().trim().max(500).default(""),
  })
  .superRefine(checkShift);
export type ShiftInput = z.infer<typeof shiftInputSchema>;

export const rotaRangeQuerySchema = z
  .object({
    from: z.iso.datetime({ offset: true }).transform((s) => new Date(s)),
    to: z.iso.datetime({ offset: true }).transform((s) => new Date(s)),
  })
  .refine((q) => q.to.getTime() > q.from.getTime() && q.to.getTime() - q.from.getTime() <= 92 * 86_400_000, {
    message: "to must follow from, at most 92 days later",
    path: ["to"],
  });

// "YYYY-MM-DD HH:mm", 24-hour (a "T" for the space as well); stored with the "T"
const localDateTime = z
  .string()
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}[T ]([01]\d|2[0-3]):[0-5]\d$/, "a date and 24-hour time, YYYY-MM-DD HH:mm")
  .transform((s) => s.replace(" ", "T"));

/**
 * The rota form: wall-clock times in the viewer's time zone, typed as "YYYY-MM-DD HH:mm" (24-hour),
 * turned into the API body with `toShiftInput` (lib/notify/rota-form.ts).
 */
export const shiftFormSchema = z
  .object({
    startsLocal: localDateTime,
    endsLocal: localDateTime,
    primaryId: z.string().min(1, "choose a primary"),
    backupId: z.string(),
    notes: z.string().max(500),
  })
  .superRefine((f, ctx) => {
    if (f.endsLocal <= f.startsLocal) ctx.addIssue({ code: "custom", path: ["endsLocal"], message: "a shift must end after it starts" });
    if (f.backupId !== "" && f.backupId === f.primaryId) {
      ctx.addIssue({ code: "custom", path: ["backupId"], message: "the backup must be someone other than the primary" });
    }
  });
export type ShiftFormValues = z.infer<typeof shiftFormSchema>;
