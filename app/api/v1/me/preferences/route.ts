import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getPreferencesView, savePreferences } from "@/lib/notify/preferences";
import { preferencesSchema } from "@/lib/validations/paging";

/** Paging preferences: channels, quiet hours, task sites. The on-call primary cannot mute pages (422). */
export const GET = handler({ roles: can.read }, async ({ user }) => getPreferencesView(user));

export const PUT = handler({ roles: can.read, body: preferencesSchema }, async ({ user, body }) => savePreferences(user, body));
