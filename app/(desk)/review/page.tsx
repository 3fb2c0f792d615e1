import { LineChart } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Review" };

export default async function ReviewPage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="Response-time review" description="How fast each step happened, from merger to first report." />
      <EmptyState icon={LineChart} title="Nothing to review yet">
        Once candidates have been paged, acknowledged and decided, the durations of each step appear here.
      </EmptyState>
    </>
  );
}
