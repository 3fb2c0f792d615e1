import { ReportsList } from "@/components/skymap/reports-list";
import { SkymapPanel } from "@/components/skymap/skymap-panel";
import { can, hasRole } from "@/lib/auth/roles";
import { getSessionUser } from "@/lib/auth/session";

/**
 * The candidate page's sky-map area (issue 8): localisation numbers and maps, site visibility, uploads, and the
 * observation reports with their files. A server component: it reads the viewer's role once for the controls.
 */
export async function SkymapSlot({ candidateId, timeZone }: { candidateId: string; revision: number; timeZone: string }) {
  const user = await getSessionUser();
  if (!user) return null;
  return (
    <>
      <SkymapPanel candidateId={candidateId} canUpload={hasRole(user, can.uploadSkymap)} timeZone={timeZone} />
      <ReportsList candidateId={candidateId} viewer={{ id: user.id, role: user.role }} timeZone={timeZone} />
    </>
  );
}
