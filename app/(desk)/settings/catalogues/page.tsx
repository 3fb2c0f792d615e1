import { CataloguesPanel } from "@/components/settings/catalogues-panel";
import { PageHeader } from "@/components/ui/page-header";
import { Panel } from "@/components/ui/panel";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Galaxy catalogues" };

export default async function CataloguesPage() {
  const user = await requirePageUser(can.read);
  return (
    <div className="max-w-4xl space-y-4">
      <PageHeader title="Galaxy catalogues" description="Catalogues whose galaxies are ranked as possible hosts in a candidate's 3D sky map." />
      <Panel>
        <CataloguesPanel canManage={hasRole(user, can.manageCatalogues)} timeZone={user.timeZone} />
      </Panel>
    </div>
  );
}
