import { Waves } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Candidates" };

export default async function CandidatesPage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Candidates" description="Every candidate trigger received, newest first." />
      <EmptyState icon={Waves} title="No candidates received">
        Candidates arrive from the detector network&apos;s feed; each one gets a page with its derived quantities.
      </EmptyState>
    </>
  );
}
