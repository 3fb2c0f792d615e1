import { CandidateList } from "@/components/candidate/candidate-list";
import { Caution } from "@/components/candidate/caution";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { listCandidates } from "@/lib/data/candidates";
import { candidateListQuerySchema } from "@/lib/validations/candidates";

export const metadata = { title: "Candidates" };
export const dynamic = "force-dynamic";

export default async function CandidatesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser();
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v.join(",") : v]));
  const parsed = candidateListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : candidateListQuerySchema.parse({});
  const page = await listCandidates(query);
  return (
    <>
      <PageHeader title="Candidates" description="Every candidate the feed sent, newest first. Sorting, filters and search run on the server and are kept in the address, so a view can be bookmarked." />
      <Caution compact />
      <CandidateList initialPage={page} initialQuery={query} timeZone={user.timeZone} />
    </>
  );
}
