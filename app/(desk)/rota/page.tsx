import { CalendarClock } from "lucide-react";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";

export const metadata = { title: "Rota" };

export default async function RotaPage() {
  await requirePageUser();
  return (
    <>
      <PageHeader title="On-call rota" description="Who is primary and backup shifter, shown in your time zone." />
      <EmptyState icon={CalendarClock} title="No shifts planned">
        Coordinators add shifts here; the primary on shift is paged first when a candidate arrives.
      </EmptyState>
    </>
  );
}
