"use client";

import dynamic from "next/dynamic";
import type { TrackSeries } from "./track-data";

const TrackChart = dynamic(() => import("./track-chart"), {
  ssr: false,
  loading: () => <div className="h-96 animate-pulse rounded-md bg-sunken" aria-label="Loading the plot" />,
});

/** The frequency-track plot, with the chart library loaded only on this page and only in the browser. */
export function TrackPlot({ series }: { series: TrackSeries | null }) {
  if (!series || series.samples.length === 0) return <p className="text-sm text-muted">This revision has no frequency track to plot.</p>;
  return <TrackChart series={series} />;
}
