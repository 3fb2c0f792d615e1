import { LayoutGrid } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Triage board" };

export default async function TriagePage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Triage board" description="Candidate triggers by triage state." />
      <EmptyState icon={LayoutGrid} title="No candidates yet">
        New triggers from the detector feed appear here in the first column as they arrive.
      </EmptyState>
    </>
  );
}
