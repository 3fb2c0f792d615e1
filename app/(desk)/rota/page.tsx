import { PageHeader } from "@/components/ui/page-header";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { listRotaPeople } from "@/lib/data/rota";
import { readEscalationPolicy } from "@/lib/notify/policy-store";
import { shownWeek } from "@/lib/notify/rota-week";
import { EscalationPolicyPanel } from "./_components/escalation-policy-panel";
import { RotaView } from "./_components/rota-view";

export const metadata = { title: "Rota" };

export default async function RotaPage({ searchParams }: { searchParams: Promise<{ week?: string }> }) {
  const user = await requirePageUser();
  const canEdit = hasRole(user, can.manageRota);
  const { week } = await searchParams;
  const { nowMs, weekStart } = shownWeek(week, user.timeZone);
  const [people, policy] = await Promise.all([canEdit ? listRotaPeople() : Promise.resolve([]), readEscalationPolicy()]);
  return (
    <div className="space-y-4">
      <PageHeader
        title="On-call rota"
        description={`Who is primary and backup shifter, in your time zone (${user.timeZone}); hover a time for UTC. The primary on shift when a candidate arrives is paged first.`}
      />
      <RotaView weekStart={weekStart} timeZone={user.timeZone} people={people} canEdit={canEdit} nowMs={nowMs} />
      <EscalationPolicyPanel policy={policy} canEdit={hasRole(user, can.manageSettings)} />
    </div>
  );
}
