import { CandidateList } from "@/components/candidate/candidate-list";
import { Caution } from "@/components/candidate/caution";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { listCandidates } from "@/lib/data/candidates";
import { parseCandidateListParams } from "@/lib/validations/candidates";

export const metadata = { title: "Candidates" };
export const dynamic = "force-dynamic";

export default async function CandidatesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageUser();
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v.join(",") : v]));
  // One parameter at a time: a bad one is left out and named, the others (the search above all) still apply.
  const { query, ignored } = parseCandidateListParams(raw);
  const page = await listCandidates(query);
  return (
    <>
      <PageHeader title="Candidates" description="Every candidate the feed sent, newest first. Sorting, filters and search run on the server and are kept in the address, so a view can be bookmarked." />
      <Caution compact />
      {ignored.length > 0 ? (
        <p role="status" className="mb-3 rounded-md border border-warn/40 bg-warn/10 px-3 py-2 text-sm" data-testid="ignored-params">
          Left out of the address: {ignored.map((i) => i.message).join("; ")}.
        </p>
      ) : null}
      {/* The page number as served: past the last page it is the last page. */}
      <CandidateList initialPage={page} initialQuery={{ ...query, page: page.page }} timeZone={user.timeZone} />
    </>
  );
}
