import { MailX } from "lucide-react";
import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/roles";
import { requirePageUser } from "@/lib/auth/session";
import { listDeadLetters } from "@/lib/data/dead-letters";
import { DeadLetterCard } from "./_components/dead-letter-card";

export const metadata = { title: "Rejected feed posts" };

const pageSize = 50;

export default async function DeadLettersPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  await requirePageUser(can.readDeliveryFailures);
  const { before } = await searchParams;
  const beforeDate = before && !Number.isNaN(Date.parse(before)) ? new Date(before) : undefined;
  const letters = await listDeadLetters({ limit: pageSize, before: beforeDate });
  const oldest = letters.at(-1);
  return (
    <>
      <PageHeader
        title="Rejected feed posts"
        description="Correctly signed posts the feed route refused (not JSON, schema violations, over-long tracks), kept raw with the reason. Wrongly signed posts are not kept."
        actions={beforeDate ? <Link className="text-sm text-accent underline" href="/dead-letters">Newest</Link> : null}
      />
      {letters.length === 0 ? (
        <EmptyState icon={MailX} title={beforeDate ? "No older rejected posts" : "No rejected feed posts"}>
          When the detector feed sends a body Chirpdesk cannot accept, it appears here with every field at fault.
        </EmptyState>
      ) : (
        <ol className="space-y-3">
          {letters.map((letter) => (
            <li key={letter.id}>
              <DeadLetterCard letter={letter} />
            </li>
          ))}
        </ol>
      )}
      {letters.length === pageSize && oldest ? (
        <p className="mt-4 text-sm">
          <Link className="text-accent underline" href={`/dead-letters?before=${encodeURIComponent(oldest.receivedAt.toISOString())}`}>
            Older posts
          </Link>
        </p>
      ) : null}
    </>
  );
}
