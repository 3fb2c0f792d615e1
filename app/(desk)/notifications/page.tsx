import { Settings2 } from "lucide-react";
import Link from "next/link";
import { FailedDeliveries } from "@/components/paging/failed-deliveries";
import { NotificationList } from "@/components/paging/notification-list";
import { PageHeader } from "@/components/ui/page-header";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Call-outs" };

export default async function NotificationsPage() {
  const user = await requirePageUser();
  return (
    <div className="max-w-5xl space-y-4">
      <PageHeader
        title="Call-outs"
        description="Everything you were paged about, newest first, and whether push and e-mail reached you. Times in your zone; hover for UTC."
        actions={
          <Link href="/notifications/preferences" className="inline-flex h-8 items-center gap-1.5 rounded-md border border-line px-2.5 text-sm hover:border-line-strong">
            <Settings2 aria-hidden className="h-4 w-4" /> How you are paged
          </Link>
        }
      />
      {hasRole(user, can.readDeliveryFailures) ? (
        <Panel>
          <PanelTitle>Failed deliveries (everyone)</PanelTitle>
          <FailedDeliveries timeZone={user.timeZone} />
        </Panel>
      ) : null}
      <NotificationList timeZone={user.timeZone} />
    </div>
  );
}
