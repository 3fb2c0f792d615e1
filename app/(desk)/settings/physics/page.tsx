import { Caution } from "@/components/candidate/caution";
import { PhysicsSettingsForm } from "@/components/settings/physics-settings-form";
import { PageHeader } from "@/components/ui/page-header";
import { Panel } from "@/components/ui/panel";
import { can } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { getSetting } from "@/lib/data/settings";

export const metadata = { title: "Physics settings" };

export default async function PhysicsSettingsPage() {
  await requirePageUser(can.manageSettings);
  const settings = await getSetting("physics");
  return (
    <div className="max-w-4xl space-y-4">
      <PageHeader
        title="Physics settings"
        description="Class boundaries, the neutron-star radius, the Monte Carlo sample count, the chirp model and the p-astro inputs. Each trigger keeps the settings it was computed with."
      />
      <Caution />
      <Panel>
        <PhysicsSettingsForm initial={settings} />
      </Panel>
    </div>
  );
}
