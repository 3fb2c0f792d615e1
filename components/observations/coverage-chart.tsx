"use client";

import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface CurvePoint {
  hours: number;
  percent: number;
}

export interface SiteMark {
  code: string;
  hours: number;
}

const axis = { stroke: "var(--c-muted)", fontSize: 11 };
// Sites are told apart by dash pattern and label as well as colour.
const dashes = ["4 3", "1 3", "8 3 2 3", "2 2", "10 4"];
const colours = ["var(--c-class-nsbh)", "var(--c-class-bns)", "var(--c-warn)", "var(--c-accent)", "var(--c-class-bbh)"];
const hoursLabel = (h: number) => (h < 10 ? h.toFixed(1) : String(Math.round(h)));

/** Covered probability against hours since merger: one step per exposure (at its end), each site's first exposure marked. */
export default function CoverageChart({ points, sites }: { points: CurvePoint[]; sites: SiteMark[] }) {
  const data = [{ hours: 0, percent: 0 }, ...points];
  return (
    <div className="h-56" role="img" aria-label={`Covered probability against hours since merger, ${points.length} exposures; first exposure of ${sites.map((s) => s.code).join(", ")}`}>
      <ResponsiveContainer width="100%" height="100%">
        <LineChart data={data} margin={{ top: 16, right: 12, bottom: 18, left: 4 }}>
          <CartesianGrid stroke="var(--c-line)" strokeDasharray="3 3" />
          <XAxis dataKey="hours" type="number" domain={[0, "dataMax"]} tickFormatter={hoursLabel} {...axis} label={{ value: "hours since merger", position: "insideBottom", offset: -10, fill: "var(--c-muted)", fontSize: 11 }} />
          <YAxis dataKey="percent" type="number" domain={[0, 100]} unit=" %" width={48} {...axis} />
          <Tooltip
            formatter={(v) => (typeof v === "number" ? `${v.toFixed(1)} %` : String(v))}
            labelFormatter={(h) => `${typeof h === "number" ? h.toFixed(2) : String(h)} h after merger`}
            contentStyle={{ background: "var(--c-surface)", border: "1px solid var(--c-line)", fontSize: 12 }}
          />
          {sites.map((s, i) => (
            <ReferenceLine
              key={s.code}
              x={s.hours}
              stroke={colours[i % colours.length]}
              strokeDasharray={dashes[i % dashes.length]}
              label={{ value: s.code, position: "top", fill: "var(--c-fg)", fontSize: 11 }}
            />
          ))}
          <Line name="Covered probability" dataKey="percent" type="stepAfter" stroke="var(--c-accent)" strokeWidth={2} dot={{ r: 2 }} isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
}
