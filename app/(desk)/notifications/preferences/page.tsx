import { PagingSettings } from "@/components/paging/paging-settings";
import { PageHeader } from "@/components/ui/page-header";
import { Panel } from "@/components/ui/panel";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "How you are paged" };

export default async function PagingPreferencesPage() {
  const user = await requirePageUser();
  return (
    <div className="max-w-3xl space-y-4">
      <PageHeader title="How you are paged" description="Push devices, e-mail, quiet hours and the sites whose follow-up tasks you hear about." />
      <Panel>
        <PagingSettings role={user.role} />
      </Panel>
    </div>
  );
}
