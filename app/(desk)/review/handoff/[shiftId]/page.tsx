import { CalendarX } from "lucide-react";
import Link from "next/link";
import { HandoffView } from "@/components/review/handoff-view";
import { PrintButton } from "@/components/review/print-button";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { formatClock, formatInZone } from "@/lib/format/time";
import { reviewNowMs } from "@/lib/review/clock";
import { getHandoffSummary } from "@/lib/review/handoff";
import { dayInZone } from "@/lib/review/range";

export const metadata = { title: "Shift handoff" };

export default async function HandoffPage({ params }: { params: Promise<{ shiftId: string }> }) {
  const user = await requirePageUser();
  const { shiftId } = await params;
  const summary = await getHandoffSummary(shiftId, reviewNowMs());
  if (!summary) {
    return (
      <EmptyState icon={CalendarX} title="No such shift" action={<Link href="/rota" className="text-accent hover:underline">Open the rota</Link>}>
        The shift may have been deleted from the rota.
      </EmptyState>
    );
  }
  const { shift } = summary;
  return (
    <>
      <PageHeader
        title={`Shift handoff · ${formatInZone(shift.startsAtMs, user.timeZone).slice(0, 16)} – ${formatClock(shift.endsAtMs, user.timeZone)}`}
        description={
          <>
            Primary {shift.primaryName}
            {shift.backupName ? `, backup ${shift.backupName}` : ""}. As of {formatInZone(summary.builtAtMs, user.timeZone)}; deadlines
            as set now.{" "}
            <Link
              href={`/review?from=${dayInZone(shift.startsAtMs, user.timeZone)}&to=${dayInZone(shift.endsAtMs - 1, user.timeZone)}&shift=${shift.id}`}
              className="no-print text-accent hover:underline"
            >
              Open in the review
            </Link>
          </>
        }
        actions={<PrintButton />}
      />
      <HandoffView summary={summary} timeZone={user.timeZone} />
    </>
  );
}
