import { ClipboardList } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Sites" };

export default async function SitesPage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Observing sites" description="Telescopes that take follow-up tasks, and what each can see tonight." />
      <EmptyState icon={ClipboardList} title="No sites defined">
        Coordinators add sites with their position, altitude limit and field of view.
      </EmptyState>
    </>
  );
}
