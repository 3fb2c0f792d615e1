"use client";

import { useQuery } from "@tanstack/react-query";
import { Check, Lightbulb, Plus, X } from "lucide-react";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { skymapKeys } from "@/components/skymap/query-keys";
import { apiFetch } from "@/lib/api-client";
import type { TaskSuggestion } from "@/lib/data/visibility";
import { taskKindLabels } from "@/lib/triage/task-states";
import type { TaskDraftInput } from "@/lib/validations/tasks";

/** A `datetime-local` value in the browser's zone, which is how the planning form reads it back. */
function localInputValue(iso: string): string {
  const d = new Date(iso);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

function windowText(s: TaskSuggestion): string {
  const fmt = new Intl.DateTimeFormat("en-GB", { month: "short", day: "numeric", hour: "2-digit", minute: "2-digit", timeZoneName: "short" });
  return `${fmt.format(new Date(s.windowStart))} – ${fmt.format(new Date(s.windowEnd))}`;
}

/**
 * Suggested follow-up tasks inside the planning form (issue 8): one per site with the most observable probability
 * of the newest sky map, kind by field of view, window = the best window. "Add" puts it in the form (where it can be
 * edited or removed); "Drop" hides it.
 */
export function SuggestedTasksSlot({ candidateId, onAccept }: { candidateId: string; onAccept: (draft: TaskDraftInput) => void }) {
  const [handled, setHandled] = useState<Record<string, "added" | "dropped">>({});
  const query = useQuery({
    queryKey: skymapKeys.suggestions(candidateId),
    queryFn: () => apiFetch<{ skymapId: string | null; suggestions: TaskSuggestion[] }>(`/api/v1/candidates/${candidateId}/suggestions`),
  });
  if (query.isLoading) return <p className="text-sm text-muted">Looking for sites that can observe the sky map tonight…</p>;
  if (query.isError || !query.data) return null;
  const { skymapId, suggestions } = query.data;
  if (!skymapId) return <p className="text-xs text-faint">No sky map yet, so no suggestions: plan the tasks by hand.</p>;
  if (suggestions.length === 0) return <p className="text-xs text-faint">No site can observe enough of the 90&nbsp;% region during its coming night.</p>;
  const visible = suggestions.filter((s) => handled[s.siteId] !== "dropped");
  return (
    <section aria-labelledby="suggested-title" className="space-y-2 rounded-md border border-accent/40 bg-accent/5 p-3" data-testid="suggested-tasks">
      <h3 id="suggested-title" className="flex items-center gap-1.5 text-sm font-medium">
        <Lightbulb aria-hidden className="h-4 w-4 text-accent" /> Suggested from the sky map
      </h3>
      <ul className="space-y-2">
        {visible.map((s) => {
          const added = handled[s.siteId] === "added";
          return (
            <li key={s.siteId} className="flex flex-wrap items-start justify-between gap-2 text-sm">
              <div className="min-w-0">
                <p>
                  <span className="font-mono">{s.siteCode}</span> {s.siteName} · <span className="font-medium">{taskKindLabels[s.kind]}</span> ·{" "}
                  <span className="text-ok">{Math.round(s.observableProbability * 100)}&nbsp;% observable</span>
                </p>
                <p className="text-xs text-muted">
                  {windowText(s)}
                  {s.pointings ? ` · ~${s.pointings} pointings` : ""}
                </p>
              </div>
              <div className="flex gap-1">
                <Button
                  size="sm"
                  variant={added ? "ghost" : "secondary"}
                  disabled={added}
                  onClick={() => {
                    onAccept({
                      kind: s.kind,
                      siteId: s.siteId,
                      windowStart: localInputValue(s.windowStart),
                      windowEnd: localInputValue(s.windowEnd),
                      priority: s.priority,
                      notes: s.notes,
                    });
                    setHandled((h) => ({ ...h, [s.siteId]: "added" }));
                  }}
                >
                  {added ? <Check aria-hidden className="h-3.5 w-3.5" /> : <Plus aria-hidden className="h-3.5 w-3.5" />}
                  {added ? "Added below" : "Add"}
                </Button>
                {!added ? (
                  <Button size="sm" variant="ghost" aria-label={`Drop the suggestion for ${s.siteCode}`} onClick={() => setHandled((h) => ({ ...h, [s.siteId]: "dropped" }))}>
                    <X aria-hidden className="h-3.5 w-3.5" /> Drop
                  </Button>
                ) : null}
              </div>
            </li>
          );
        })}
      </ul>
      {visible.length === 0 ? <p className="text-xs text-faint">All suggestions dropped.</p> : null}
    </section>
  );
}
