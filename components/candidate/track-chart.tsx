"use client";

import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis } from "recharts";
import type { TrackSeries } from "./track-data";

const axis = { stroke: "var(--c-muted)", fontSize: 11 };
const tick = (v: number) => (Math.abs(v) >= 1000 || (Math.abs(v) < 0.01 && v !== 0) ? v.toExponential(1) : String(Number(v.toPrecision(3))));

/** The measured track with the fitted chirp (the model fit.model names), and the residuals beneath (recharts; loaded on demand). */
export default function TrackChart({ series }: { series: TrackSeries }) {
  return (
    <div className="space-y-2" role="img" aria-label={`${series.yLabel} against ${series.xLabel}: measured track, fitted chirp and residuals`}>
      <div className="h-64">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 8, right: 12, bottom: 18, left: 8 }}>
            <CartesianGrid stroke="var(--c-line)" strokeDasharray="3 3" />
            <XAxis dataKey="x" type="number" domain={["dataMin", "dataMax"]} tickFormatter={tick} {...axis} label={{ value: series.xLabel, position: "insideBottom", offset: -10, fill: "var(--c-muted)", fontSize: 11 }} />
            <YAxis dataKey="y" type="number" domain={["auto", "auto"]} tickFormatter={tick} {...axis} label={{ value: series.yLabel, angle: -90, position: "insideLeft", fill: "var(--c-muted)", fontSize: 11 }} />
            <Tooltip formatter={(v) => (typeof v === "number" ? tick(v) : String(v))} contentStyle={{ background: "var(--c-surface)", border: "1px solid var(--c-line)", fontSize: 12 }} />
            <ZAxis range={[14, 14]} />
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 12 }} />
            <Scatter name="Measured track" data={series.samples} fill="var(--c-class-nsbh)" shape="circle" isAnimationActive={false} />
            <Line name="Fitted chirp" data={series.curve} dataKey="y" stroke="var(--c-warn)" strokeWidth={2.5} dot={false} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      {series.residuals.length ? (
        <div className="h-32">
          <ResponsiveContainer width="100%" height="100%">
            <ScatterChart margin={{ top: 4, right: 12, bottom: 18, left: 8 }}>
              <CartesianGrid stroke="var(--c-line)" strokeDasharray="3 3" />
              <XAxis dataKey="x" type="number" domain={["dataMin", "dataMax"]} tickFormatter={tick} {...axis} />
              <YAxis dataKey="r" type="number" tickFormatter={tick} {...axis} label={{ value: series.residualLabel, angle: -90, position: "insideLeft", fill: "var(--c-muted)", fontSize: 11 }} />
              <ZAxis range={[14, 14]} />
              <ReferenceLine y={0} stroke="var(--c-muted)" />
              <Scatter name="Residuals" data={series.residuals} fill="var(--c-class-bns)" isAnimationActive={false} />
            </ScatterChart>
          </ResponsiveContainer>
        </div>
      ) : (
        <p className="text-xs text-muted">No residuals: the fit did not run for this revision.</p>
      )}
    </div>
  );
}
