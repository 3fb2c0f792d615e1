import { z } from "zod";
import { preferredRules } from "@/lib/triggers/preferred";

/**
 * How triggers from several pipelines group into one candidate. A new trigger joins a live candidate with a live
 * trigger whose event time is within ± the window (edge included); the preferred trigger follows `preferredBy`
 * (lib/triggers/preferred.ts). ±1 s is our default: pipelines' merger-time estimates of one signal differ by far
 * less, and separate signals seconds apart stay apart.
 */
export const groupingSettingsSchema = z.object({
  coincidenceWindowMs: z.number().int().min(0).max(10_000).default(1000),
  preferredBy: z.enum(preferredRules).default("lowest-far"),
});
export type GroupingSettings = z.infer<typeof groupingSettingsSchema>;

/** `PUT /api/v1/settings/grouping` and the settings form: every field, no defaults. */
export const groupingInputSchema = z.strictObject({
  coincidenceWindowMs: z.number("a number of milliseconds").int("whole milliseconds").min(0).max(10_000, "at most 10 000 ms (±10 s)"),
  preferredBy: z.enum(preferredRules),
});
export type GroupingInput = z.infer<typeof groupingInputSchema>;
