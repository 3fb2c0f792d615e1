import Link from "next/link";
import { PagingSettings } from "@/components/paging/paging-settings";
import { ApiTokens } from "@/components/settings/api-tokens";
import { GroupingForm } from "@/components/settings/grouping-form";
import { ProfileForm } from "@/components/settings/profile-form";
import { PageHeader } from "@/components/ui/page-header";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { getSetting } from "@/lib/data/settings";

export const metadata = { title: "Settings" };

export default async function SettingsPage() {
  const user = await requirePageUser();
  const grouping = hasRole(user, can.manageSettings) ? await getSetting("grouping") : null;
  return (
    <div className="max-w-4xl space-y-4">
      <PageHeader title="Settings" description="Your profile, how you are paged, and tokens for scripts." />
      <Panel>
        <PanelTitle>Profile</PanelTitle>
        <ProfileForm name={user.name} timeZone={user.timeZone} />
      </Panel>
      <Panel>
        <PanelTitle>How you are paged</PanelTitle>
        <PagingSettings role={user.role} />
      </Panel>
      {grouping ? (
        <Panel>
          <PanelTitle>Physics for triage</PanelTitle>
          <p className="text-sm text-muted">
            Class boundaries, neutron-star radius, sample count, chirp model and p-astro inputs:{" "}
            <Link href="/settings/physics" className="text-accent hover:underline">
              physics settings
            </Link>
            .
          </p>
        </Panel>
      ) : null}
      {grouping ? (
        <Panel>
          <PanelTitle>Grouping triggers into candidates</PanelTitle>
          <GroupingForm initial={grouping} />
        </Panel>
      ) : null}
      <Panel>
        <PanelTitle>Galaxy catalogues</PanelTitle>
        <p className="text-sm text-muted">
          The catalogues candidates&apos; galaxy tables rank:{" "}
          <Link href="/settings/catalogues" className="text-accent hover:underline">
            galaxy catalogues
          </Link>
          .
        </p>
      </Panel>
      <Panel>
        <PanelTitle>API tokens</PanelTitle>
        <ApiTokens />
      </Panel>
    </div>
  );
}
