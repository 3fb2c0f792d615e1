"use client";

import { useDroppable } from "@dnd-kit/core";
import { Users } from "lucide-react";
import { Avatar } from "@/components/ui/avatar";
import { cn } from "@/components/ui/cn";
import type { Roster, RosterPerson } from "@/lib/data/triage";

/** On-call people (and everyone else who may own a candidate) as drop targets: drop a card on a person to assign. */
export function RosterStrip({ roster, dragging }: { roster: Roster; dragging: boolean }) {
  const duty = new Map<string, string>();
  for (const shift of roster.onCall) {
    duty.set(shift.primary.id, "on call");
    if (shift.backup) duty.set(shift.backup.id, duty.get(shift.backup.id) ?? "backup");
  }
  return (
    <aside aria-label="People on call" className="mb-3 flex flex-wrap items-center gap-2 rounded-lg border border-line bg-surface px-3 py-2">
      <span className="flex items-center gap-1.5 text-xs font-medium text-muted">
        <Users aria-hidden className="h-4 w-4" />
        {dragging ? "Drop on a person to assign:" : roster.onCall.length ? "On call now:" : "Nobody on call now. People:"}
      </span>
      {roster.people.map((person) => (
        <PersonTarget key={person.id} person={person} duty={duty.get(person.id)} />
      ))}
      {roster.people.length === 0 ? <span className="text-xs text-faint">No shifters or coordinators yet.</span> : null}
    </aside>
  );
}

function PersonTarget({ person, duty }: { person: RosterPerson; duty?: string }) {
  const { setNodeRef, isOver } = useDroppable({ id: `person:${person.id}`, data: { kind: "person", person } });
  return (
    <span
      ref={setNodeRef}
      data-person-id={person.id}
      className={cn(
        "inline-flex items-center gap-1.5 rounded-full border py-0.5 pl-0.5 pr-2.5 text-xs",
        isOver ? "border-accent bg-accent/15" : duty ? "border-ok/40 bg-ok/10" : "border-line bg-raised",
      )}
    >
      <Avatar name={person.name} initials={person.initials} />
      {person.name}
      {duty ? <span className="font-medium text-ok">· {duty}</span> : null}
    </span>
  );
}
