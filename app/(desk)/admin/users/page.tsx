import { UsersAdmin } from "@/components/admin/users-admin";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "People & roles" };

export default async function UsersPage() {
  const user = await requirePageUser(can.manageUsers);
  return (
    <>
      <PageHeader
        title="People & roles"
        description="Who can sign in and what they may do. Shifters triage, observers claim follow-up tasks, coordinators run the rota and settings, administrators manage accounts."
      />
      <UsersAdmin actor={user} />
    </>
  );
}
