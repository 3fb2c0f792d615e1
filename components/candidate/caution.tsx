import { TriangleAlert } from "lucide-react";

export const CAUTION_TEXT =
  "Rapid estimates for triage, not parameter estimation. Official parameter estimates and local observatory safety rules take precedence.";

/**
 * The caution every derived number carries, shown where those numbers are read closely; `compact` is the one-line
 * form for pages that list many candidates' numbers (board, candidate list).
 */
export function Caution({ compact = false }: { compact?: boolean }) {
  const box = compact ? "mb-3 px-2.5 py-1.5 text-xs" : "px-3 py-2 text-sm";
  return (
    <p role="note" className={`flex items-start gap-2 rounded-md border border-warn/40 bg-warn/10 text-fg ${box}`}>
      <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-warn" />
      <span>{CAUTION_TEXT}</span>
    </p>
  );
}
