"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/api-client";
import { can, hasRole, type Role } from "@/lib/auth/roles";
import { DevicePanel } from "./device-panel";
import { PreferencesForm } from "./preferences-form";
import { pagingKeys } from "./query-keys";
import type { PreferencesView } from "./types";

/**
 * "How you are paged" on the settings page: this device's push subscription, the person's devices, a test page,
 * channels, quiet hours and (for observers and coordinators) the sites whose follow-up tasks they hear about.
 */
export function PagingSettings({ role }: { role?: Role }) {
  const prefs = useQuery({ queryKey: pagingKeys.preferences, queryFn: () => apiFetch<PreferencesView>("/api/v1/me/preferences") });
  if (prefs.isPending) return <p className="text-sm text-muted">Loading…</p>;
  if (prefs.isError) return <p role="alert" className="text-sm text-alarm">Could not load paging preferences: {prefs.error.message}</p>;
  const showTaskSites = role === undefined || hasRole({ role }, can.claimTask);
  return (
    <div className="space-y-6">
      <section aria-labelledby="paging-devices" className="space-y-2">
        <h3 id="paging-devices" className="text-sm font-medium">
          Devices
        </h3>
        <DevicePanel timeZone={prefs.data.timeZone} />
      </section>
      <section aria-labelledby="paging-prefs" className="space-y-2">
        <h3 id="paging-prefs" className="sr-only">
          Preferences
        </h3>
        <PreferencesForm key={JSON.stringify(prefs.data.preferences)} view={prefs.data} showTaskSites={showTaskSites} />
      </section>
    </div>
  );
}
