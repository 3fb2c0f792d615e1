import { getDb } from "@/db";
import { can, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { appendEvent } from "@/lib/data/events";
import { getSetting, putSetting, type SettingValue } from "@/lib/data/settings";
import { eventKinds } from "@/lib/events/kinds";
import type { PhysicsSettingsInput } from "@/lib/validations/physics-settings";

/**
 * Replaces the physics settings (validated by physicsSettingsInputSchema at the route) and audits the change with
 * the fields that changed, before and after, in one write transaction. Applies to triggers ingested from now on:
 * each stored derived result keeps the settings it used (derived.settingsUsed).
 */
export async function savePhysicsSettings(actor: SessionUser, input: PhysicsSettingsInput, now: Date = new Date()): Promise<SettingValue<"physics">> {
  requireRole(actor, can.manageSettings, "change the physics settings");
  const db = await getDb();
  await db.transaction(async (tx) => {
    const before = await getSetting("physics", tx);
    const changed = (Object.keys(input) as Array<keyof PhysicsSettingsInput>).filter((k) => before[k] !== input[k]);
    await putSetting("physics", input, actor.id, tx);
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.settingsChanged,
      actorId: actor.id,
      data: {
        key: "physics",
        changed,
        before: Object.fromEntries(changed.map((k) => [k, before[k]])),
        after: Object.fromEntries(changed.map((k) => [k, input[k]])),
      },
    });
  });
  return getSetting("physics");
}
