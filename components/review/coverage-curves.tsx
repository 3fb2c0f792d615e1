"use client";

import { useMemo, useState } from "react";
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ReviewCurve } from "@/lib/review/coverage-facts";

const axis = { stroke: "var(--c-muted)", fontSize: 11 };
// Candidates are told apart by dash pattern as well as colour.
const colours = ["var(--c-accent)", "var(--c-class-nsbh)", "var(--c-class-bns)", "var(--c-warn)", "var(--c-class-gap)", "var(--c-ok)", "var(--c-class-bbh)", "var(--c-alarm)"];
const dashes = [undefined, "6 3", "2 3", "10 3 2 3", "4 4", "1 2", "8 2", "3 6"];
const FIRST_SHOWN = 5;

/** The coverage curves of the chosen candidates on one chart: probability observed against hours since merger. */
export function CoverageCurves({ curves }: { curves: ReviewCurve[] }) {
  const [chosen, setChosen] = useState<ReadonlySet<string>>(() => new Set(curves.slice(0, FIRST_SHOWN).map((c) => c.candidateId)));
  const shown = useMemo(() => curves.filter((c) => chosen.has(c.candidateId)), [curves, chosen]);
  if (curves.length === 0) return <p className="text-sm text-muted">No candidate in this range has logged exposures on a sky map.</p>;
  const toggle = (id: string) =>
    setChosen((now) => {
      const next = new Set(now);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  return (
    <div className="space-y-3">
      <div className="h-64" role="img" aria-label={`Probability observed against hours since merger for ${shown.map((c) => c.externalId).join(", ") || "no candidate"}`}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart margin={{ top: 8, right: 12, bottom: 18, left: 4 }}>
            <CartesianGrid stroke="var(--c-line)" strokeDasharray="3 3" />
            <XAxis dataKey="hours" type="number" domain={[0, "dataMax"]} allowDuplicatedCategory={false} tickFormatter={(h: number) => (h < 10 ? h.toFixed(1) : String(Math.round(h)))} {...axis} label={{ value: "hours since merger", position: "insideBottom", offset: -10, fill: "var(--c-muted)", fontSize: 11 }} />
            <YAxis type="number" domain={[0, 100]} unit=" %" width={48} {...axis} />
            <Tooltip formatter={(v) => (typeof v === "number" ? `${v.toFixed(1)} %` : String(v))} labelFormatter={(h) => `${typeof h === "number" ? h.toFixed(2) : String(h)} h`} contentStyle={{ background: "var(--c-surface)", border: "1px solid var(--c-line)", fontSize: 12 }} />
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 12 }} />
            {shown.map((c) => {
              const k = curves.indexOf(c);
              return (
                <Line
                  key={c.candidateId}
                  name={c.externalId}
                  data={[{ hours: 0, percent: 0 }, ...c.points.map((p) => ({ hours: p.secondsSinceMerger / 3600, percent: p.coveredProbability * 100 }))]}
                  dataKey="percent"
                  type="stepAfter"
                  stroke={colours[k % colours.length]}
                  strokeDasharray={dashes[k % dashes.length]}
                  strokeWidth={2}
                  dot={false}
                  isAnimationActive={false}
                />
              );
            })}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <fieldset className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        <legend className="sr-only">Candidates on the chart</legend>
        {curves.map((c) => (
          <label key={c.candidateId} className="inline-flex items-center gap-1.5 font-mono text-xs">
            <input type="checkbox" checked={chosen.has(c.candidateId)} onChange={() => toggle(c.candidateId)} />
            {c.externalId}
          </label>
        ))}
      </fieldset>
      <p className="text-xs text-faint">Union of logged footprints on each candidate&apos;s newest sky map; rapid estimates, not parameter estimates.</p>
    </div>
  );
}
