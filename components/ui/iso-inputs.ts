/**
 * Props for text inputs in the app's 24-hour ISO 8601 formats. Native date and time pickers follow the browser's
 * locale (12-hour clocks and month-first dates in en-US), unlike every other time the app shows; these take what
 * a person types and the shared zod schemas check it.
 */
const common = { type: "text", autoComplete: "off", spellCheck: false } as const;

/** "21:30": 24-hour clock time. */
export const timeInput24 = { ...common, inputMode: "numeric", placeholder: "HH:mm", pattern: "([01]\\d|2[0-3]):[0-5]\\d", maxLength: 5, title: "24-hour time, HH:mm" } as const;

/** "2026-12-04": a calendar date. */
export const dateInputIso = { ...common, inputMode: "numeric", placeholder: "YYYY-MM-DD", pattern: "\\d{4}-\\d{2}-\\d{2}", maxLength: 10, title: "date, YYYY-MM-DD" } as const;

/** "2026-12-04 21:30" (a "T" instead of the space is accepted too). */
export const dateTimeInputIso = {
  ...common,
  placeholder: "YYYY-MM-DD HH:mm",
  pattern: "\\d{4}-\\d{2}-\\d{2}[T ]([01]\\d|2[0-3]):[0-5]\\d",
  maxLength: 16,
  title: "date and 24-hour time, YYYY-MM-DD HH:mm",
} as const;
