"use client";

import { ArrowRight, ExternalLink, UserMinus } from "lucide-react";
import Link from "next/link";
import { Avatar } from "@/components/ui/avatar";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import type { TriageState } from "@/db/schema/candidates";
import type { BoardCard } from "@/lib/data/candidates";
import type { Roster, RosterPerson } from "@/lib/data/triage";
import { allowedTransitions, triageLabels } from "@/lib/triage/transitions";

/** The button equivalent of every drag: move to an allowed column, or assign to a person. */
export function CardActionsDialog({
  card,
  roster,
  canTriage,
  onClose,
  onMove,
  onAssign,
}: {
  card: BoardCard | null;
  roster: Roster;
  canTriage: boolean;
  onClose: () => void;
  onMove: (card: BoardCard, to: TriageState) => void;
  onAssign: (card: BoardCard, person: RosterPerson | null) => void;
}) {
  return (
    <Dialog
      open={card !== null}
      onOpenChange={(open) => !open && onClose()}
      title={card ? `Candidate ${card.externalId}` : "Candidate"}
      description={card ? `Now in “${triageLabels[card.triageState]}”${card.owner ? `, owned by ${card.owner.name}` : ", no owner"}.` : undefined}
    >
      {card ? (
        <div className="space-y-4">
          {canTriage ? (
            <>
              <section aria-label="Move to column">
                <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-muted">Move to</h3>
                <div className="flex flex-wrap gap-2">
                  {allowedTransitions[card.triageState].map((to) => (
                    <Button
                      key={to}
                      size="sm"
                      variant={to === "dismissed" ? "danger" : to === "pursue" ? "primary" : "secondary"}
                      onClick={() => onMove(card, to)}
                      disabled={to === "pursue" && card.withdrawn}
                      title={to === "pursue" && card.withdrawn ? "Withdrawn candidates cannot go for follow-up" : undefined}
                    >
                      <ArrowRight aria-hidden className="h-3.5 w-3.5" />
                      {triageLabels[to]}
                    </Button>
                  ))}
                </div>
              </section>
              <section aria-label="Assign to person">
                <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-muted">Assign to</h3>
                <div className="flex flex-wrap gap-2">
                  {roster.people.map((person) => (
                    <Button
                      key={person.id}
                      size="sm"
                      variant="secondary"
                      onClick={() => onAssign(card, person)}
                      disabled={card.owner?.id === person.id}
                      aria-pressed={card.owner?.id === person.id}
                    >
                      <Avatar name={person.name} initials={person.initials} className="h-5 w-5" />
                      {person.name}
                    </Button>
                  ))}
                  {card.owner ? (
                    <Button size="sm" variant="ghost" onClick={() => onAssign(card, null)}>
                      <UserMinus aria-hidden className="h-3.5 w-3.5" />
                      Clear owner
                    </Button>
                  ) : null}
                </div>
              </section>
            </>
          ) : (
            <p className="text-sm text-muted">Your role can read the triage board; shifters and coordinators move and assign candidates.</p>
          )}
          <Link href={`/candidates/${card.id}`} className="inline-flex items-center gap-1.5 text-sm text-accent hover:underline">
            <ExternalLink aria-hidden className="h-4 w-4" />
            Open the candidate page
          </Link>
        </div>
      ) : null}
    </Dialog>
  );
}
