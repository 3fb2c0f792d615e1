import { Telescope } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Follow-up board" };

export default async function FollowUpPage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Follow-up board" description="Observation tasks for candidates that shifters sent to follow-up." />
      <EmptyState icon={Telescope} title="No follow-up tasks">
        When a shifter decides to pursue a candidate, the tasks they plan appear here for observers to claim.
      </EmptyState>
    </>
  );
}
