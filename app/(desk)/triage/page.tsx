import { TriageBoard } from "@/components/board/triage-board";
import { Caution } from "@/components/candidate/caution";
import { PageHeader } from "@/components/ui/page-header";
import { can, hasRole } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { getBoard } from "@/lib/data/candidates";
import { listSiteOptions } from "@/lib/data/tasks";
import { getRoster } from "@/lib/data/triage";

export const metadata = { title: "Triage board" };
export const dynamic = "force-dynamic";

export default async function TriagePage() {
  const user = await requirePageUser();
  const [board, roster, sites] = await Promise.all([getBoard(), getRoster(), listSiteOptions()]);
  const readOnly = !hasRole(user, can.triage);
  return (
    <>
      <PageHeader
        title="Triage board"
        description={
          readOnly
            ? "Candidate triggers by triage state. Your role reads this board; shifters and coordinators move cards."
            : "Drag a card (or use its ⋯ button) to change its state; drop it on a person to assign it. Decided cards leave the board after 14 days; the candidate list keeps everything."
        }
      />
      <Caution compact />
      <TriageBoard initialBoard={board} initialRoster={roster} sites={sites} viewer={{ id: user.id, role: user.role, timeZone: user.timeZone }} />
    </>
  );
}
