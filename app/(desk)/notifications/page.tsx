import { Bell } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Pages & alerts" };

export default async function NotificationsPage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Pages & alerts" description="Everything you were paged about, newest first." />
      <EmptyState icon={Bell} title="No pages yet">
        When you are paged about a candidate or a task, it shows here at once, whether or not push or e-mail reached you.
      </EmptyState>
    </>
  );
}
