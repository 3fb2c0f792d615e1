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
