import { eq } from "drizzle-orm";
import { z } from "zod";
import { getDb, type Tx } from "@/db";
import { settings } from "@/db/schema";
import { groupingSettingsSchema } from "@/lib/validations/grouping";
import { escalationPolicySchema } from "@/lib/validations/paging";
import { physicsSettingsSchema } from "@/lib/validations/physics-settings";
import type { SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";
import { appendEvent } from "./events";

/**
 * Coordinator settings, each a zod schema with defaults, so a missing or old row still reads as a whole value.
 * Areas add their own key here.
 */
export const settingSchemas = {
  physics: physicsSettingsSchema,
  /**
   * Minutes. acknowledgeWarn runs from receipt (the board's amber timer); the board's alarm is the acknowledgement
   * deadline, pageMinutes + acknowledgeStepMinutes from receipt (acknowledgeDeadlineMinutes in
   * lib/validations/review.ts), so acknowledgeAlarmMinutes is no longer read (kept so stored rows parse). The others are the review's step
   * deadlines, each on that step's own duration (lib/review/steps.ts): merger → receipt (feedLatency),
   * receipt → first page (page), first page → acknowledged (acknowledgeStep), acknowledged → decision (decision),
   * pursue → first claim (claim), first claim → first report (report); and from the merger, the first exposure
   * (firstExposure) and 50 % / 90 % of the probability observed (covered50, covered90).
   */
  deadlines: z.object({
    acknowledgeWarnMinutes: z.number().min(0.5).max(240).default(3),
    acknowledgeAlarmMinutes: z.number().min(0.5).max(240).default(5),
    decisionMinutes: z.number().min(1).max(24 * 60).default(30),
    claimMinutes: z.number().min(1).max(24 * 60).default(60),
    reportMinutes: z.number().min(1).max(7 * 24 * 60).default(12 * 60),
    pageMinutes: z.number().min(0.1).max(60).default(1),
    feedLatencyMinutes: z.number().min(0.1).max(60).default(2),
    acknowledgeStepMinutes: z.number().min(0.5).max(240).default(4),
    firstExposureMinutes: z.number().min(1).max(7 * 24 * 60).default(120),
    covered50Minutes: z.number().min(1).max(7 * 24 * 60).default(12 * 60),
    covered90Minutes: z.number().min(1).max(14 * 24 * 60).default(48 * 60),
  }),
  /** how triggers from several pipelines group into one candidate (lib/validations/grouping.ts) */
  grouping: groupingSettingsSchema,
  /** who is paged about a new candidate, when, and when not (lib/notify/policy.ts) */
  escalation: escalationPolicySchema,
} as const;

export type SettingKey = keyof typeof settingSchemas;
export type SettingValue<K extends SettingKey> = z.infer<(typeof settingSchemas)[K]>;

export async function getSetting<K extends SettingKey>(key: K, tx?: Tx): Promise<SettingValue<K>> {
  const db = tx ?? (await getDb());
  const [row] = await db.select().from(settings).where(eq(settings.key, key)).limit(1);
  const parsed = settingSchemas[key].safeParse(row?.value ?? {});
  return (parsed.success ? parsed.data : settingSchemas[key].parse({})) as SettingValue<K>;
}

export async function putSetting<K extends SettingKey>(
  key: K,
  value: SettingValue<K>,
  actorId: string | null,
  tx?: Tx,
): Promise<void> {
  const db = tx ?? (await getDb());
  const now = new Date();
  await db
    .insert(settings)
    .values({ key, value, updatedAt: now, updatedById: actorId })
    .onConflictDoUpdate({ target: settings.key, set: { value, updatedAt: now, updatedById: actorId } });
}

/** Replaces a setting with its audit event in one transaction, and answers the stored value. */
export async function saveSetting<K extends SettingKey>(
  key: K,
  value: SettingValue<K>,
  actor: Pick<SessionUser, "id">,
  now = new Date(),
): Promise<SettingValue<K>> {
  const db = await getDb();
  await db.transaction(async (tx) => {
    await putSetting(key, value, actor.id, tx);
    await appendEvent(tx, { at: now, kind: eventKinds.settingsChanged, actorId: actor.id, data: { key } });
  });
  return getSetting(key);
}
