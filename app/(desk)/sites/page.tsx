import { SitesView } from "@/components/sites/sites-view";
import { PageHeader } from "@/components/ui/page-header";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Sites" };

export default async function SitesPage() {
  const user = await requirePageUser();
  return (
    <>
      <PageHeader title="Observing sites" description="Telescopes that take follow-up tasks, and what each can see tonight." />
      <SitesView canManage={hasRole(user, can.manageSites)} timeZone={user.timeZone} />
    </>
  );
}
