import { cn } from "@/components/ui/cn";
import { classColourClasses, classLabels, classLongLabels, topClass, type ClassProbabilityMap } from "@/lib/format/classes";
import { formatPercent } from "@/lib/format/numbers";

const order = ["bns", "nsbh", "bbh", "lowerGap"] as const;

/** Four segments in the class colours plus the top class in words, so colour is never the only cue. */
export function ClassBar({ p, className }: { p: ClassProbabilityMap | null; className?: string }) {
  const top = topClass(p);
  if (!p || !top) return <p className={cn("text-xs text-faint", className)}>Class: not computed</p>;
  const summary = order.map((c) => `${classLongLabels[c]} ${formatPercent(p[c])}`).join(", ");
  return (
    <div className={cn("flex items-center gap-2", className)} title={summary}>
      <div className="flex h-2 min-w-0 flex-1 overflow-hidden rounded-sm bg-sunken" aria-hidden>
        {order.map((c) => (
          <span key={c} className={classColourClasses[c]} style={{ width: `${Math.max(0, p[c]) * 100}%` }} />
        ))}
      </div>
      <span className="shrink-0 text-xs font-medium tabular-nums">
        {classLabels[top.cls]} {formatPercent(top.p)}
      </span>
      <span className="sr-only">Class probabilities: {summary}</span>
    </div>
  );
}

/** The full breakdown for the candidate page: a row per class with its bar and number. */
export function ClassTable({ p }: { p: ClassProbabilityMap | null }) {
  if (!p) return <p className="text-sm text-muted">Class probabilities could not be computed for this revision.</p>;
  return (
    <ul className="space-y-1.5">
      {order.map((c) => (
        <li key={c} className="grid grid-cols-[minmax(0,8.5rem)_1fr_4.75rem] items-center gap-2 text-sm">
          <span className="flex items-center gap-1.5">
            <span aria-hidden className={cn("h-2.5 w-2.5 rounded-sm", classColourClasses[c])} />
            {classLongLabels[c]}
          </span>
          <span className="h-2 overflow-hidden rounded-sm bg-sunken" aria-hidden>
            <span className={cn("block h-full", classColourClasses[c])} style={{ width: `${p[c] * 100}%` }} />
          </span>
          <span className="whitespace-nowrap text-right font-mono tabular-nums">{formatPercent(p[c])}</span>
        </li>
      ))}
    </ul>
  );
}
