import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSetting } from "@/lib/data/settings";
import { savePhysicsSettings } from "@/lib/services/save-physics-settings";
import { physicsSettingsInputSchema } from "@/lib/validations/physics-settings";

/** GET /api/v1/settings/physics — class boundaries, neutron-star radius, sample count, chirp model and p-astro inputs. */
export const GET = handler({ roles: can.read }, async () => getSetting("physics"));

/**
 * PUT /api/v1/settings/physics — coordinators and admins replace every field (422 naming the field, including the
 * consistency checks); audited. Applies to triggers ingested from now on; stored results keep their settingsUsed.
 */
export const PUT = handler({ roles: can.manageSettings, body: physicsSettingsInputSchema }, async ({ user, body }) =>
  savePhysicsSettings(user, body),
);
