import { PagingSettings } from "@/components/paging/paging-settings";
import { ApiTokens } from "@/components/settings/api-tokens";
import { ProfileForm } from "@/components/settings/profile-form";
import { PageHeader } from "@/components/ui/page-header";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Settings" };

export default async function SettingsPage() {
  const user = await requirePageUser();
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
      <Panel>
        <PanelTitle>API tokens</PanelTitle>
        <ApiTokens />
      </Panel>
    </div>
  );
}
