"use client";

import { geoGraticule, geoPath } from "d3-geo";
import { useTheme } from "next-themes";
import { useEffect, useMemo, useRef, useState } from "react";
import type { NightBand } from "./night-band";
import { projectView, type SkyView } from "./projection";
import { paint, samplePixels, type RasterGrid, type Rgb } from "./raster";
import { formatDec, formatRa } from "./format";
import type { SkyFootprint } from "./footprints";
import { outlinePolygon, type SkyOutline } from "./outlines";
import { rgbCss } from "./query-keys";
import { skyPalettes, skyThemeOf } from "./palette";

export interface SkyMarker {
  raDeg: number;
  decDeg: number;
  label: string;
  kind: "sun" | "moon" | "peak" | "galaxy" | "pick";
  /** galaxies: the mark's radius in pixels (by score) */
  radius?: number;
}

export interface SkyMapProps {
  grid: RasterGrid;
  view: SkyView;
  bands: ReadonlyArray<NightBand & { code: string; colour: Rgb }>;
  markers: ReadonlyArray<SkyMarker>;
  /** Width over height of the drawing: 2 for the all-sky view, 1 for the zoom. */
  aspect: number;
  title: string;
  maxWidth?: number;
  /** footprints to draw over the map (observed: filled, solid; planned: dashed) */
  outlines?: ReadonlyArray<SkyOutline>;
  /** Planned tiles of the pointing plans, outlined in their site's colour and line pattern. */
  planTiles?: ReadonlyArray<SkyFootprint>;
  /** Write each planned tile's number at its centre (the zoomed view). */
  numbered?: boolean;
  /** called with the sky position under a click (the zoomed map asks the distance there) */
  onPick?: (raDeg: number, decDeg: number) => void;
}

const NO_TILES: ReadonlyArray<SkyFootprint> = [];

/** "9h", "9h20m": compact RA labels for grid lines. */
function raLabel(raDeg: number): string {
  const minutes = Math.round(((((raDeg % 360) + 360) % 360) * 4)) % 1440;
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return m ? `${h}h${String(m).padStart(2, "0")}m` : `${h}h`;
}

const decLabel = (decDeg: number) => (decDeg === 0 ? "0°" : `${decDeg > 0 ? "+" : "−"}${Math.abs(decDeg)}°`);

/** Keeps the drawing light: the raster is computed at CSS pixel size, at most this wide. */
const MAX_RASTER_WIDTH = 760;

function useWidth(ref: React.RefObject<HTMLElement | null>, maxWidth: number): number {
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    // small changes (a scroll bar appearing as the page grows) are ignored, so redrawing cannot feed back on itself
    const update = () => setWidth((w) => {
      const next = Math.min(maxWidth, Math.floor(el.clientWidth));
      return Math.abs(next - w) > 24 || w === 0 ? next : w;
    });
    update();
    const observer = new ResizeObserver(update);
    observer.observe(el);
    return () => observer.disconnect();
  }, [ref, maxWidth]);
  return width;
}

/** One sky view: probability raster and contours on a canvas, grid, labels and markers in SVG on top. */
export function SkyMap({ grid, view, bands, markers, aspect, title, maxWidth = MAX_RASTER_WIDTH, outlines = [], planTiles = NO_TILES, numbered = false, onPick }: SkyMapProps) {
  const wrapper = useRef<HTMLDivElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);
  const width = useWidth(wrapper, maxWidth);
  const height = Math.round(width / aspect);
  const projected = useMemo(() => (width > 0 ? projectView(view, width, height) : null), [view, width, height]);
  const [hover, setHover] = useState<[number, number] | null>(null);
  const palette = skyPalettes[skyThemeOf(useTheme().resolvedTheme)];

  // the costly part (inverse projection and HEALPix lookup per canvas pixel) depends only on the view and size
  const samples = useMemo(() => (projected ? samplePixels(width, height, grid.nside, projected.skyAt) : null), [projected, width, height, grid.nside]);
  useEffect(() => {
    const ctx = canvas.current?.getContext("2d");
    if (!ctx || !samples) return;
    ctx.putImageData(new ImageData(paint(samples, grid, bands, palette), samples.width, samples.height), 0, 0);
  }, [samples, grid, bands, palette]);

  const overlay = useMemo(() => {
    if (!projected) return null;
    const path = geoPath(projected.projection);
    const zoomStep = view.kind === "zoom" ? (view.radiusDeg > 30 ? 15 : view.radiusDeg > 12 ? 5 : 2) : 30;
    const graticule = geoGraticule().step([zoomStep, zoomStep]).precision(1)();
    const labels: Array<{ x: number; y: number; text: string; anchor: "middle" | "start" }> = [];
    if (view.kind === "all-sky") {
      for (let ra = 0; ra < 360; ra += 30) {
        const at = projected.place(ra, 0);
        if (at) labels.push({ x: at[0], y: at[1] - 3, text: `${ra / 15}h`, anchor: "middle" });
      }
      for (const dec of [-60, -30, 30, 60]) {
        const at = projected.place(180, dec);
        if (at) labels.push({ x: at[0] + 3, y: at[1] - 2, text: decLabel(dec), anchor: "start" });
      }
    } else {
      const { centre, radiusDeg } = view;
      // RA labels along a parallel in the lower part of the view, declinations along the central meridian
      const decLine = Math.round((centre.decDeg - 0.7 * radiusDeg) / zoomStep) * zoomStep;
      for (let ra = Math.floor((centre.raDeg - 90) / zoomStep) * zoomStep; ra <= centre.raDeg + 90; ra += zoomStep) {
        const at = projected.place(((ra % 360) + 360) % 360, decLine);
        if (at) labels.push({ x: at[0], y: at[1] - 3, text: raLabel(ra), anchor: "middle" });
      }
      const raLine = Math.round(centre.raDeg / zoomStep) * zoomStep;
      for (let dec = -90 + zoomStep; dec < 90; dec += zoomStep) {
        const at = projected.place(raLine, dec);
        if (at && dec !== decLine) labels.push({ x: at[0] + 3, y: at[1] - 2, text: decLabel(dec), anchor: "start" });
      }
    }
    return { outline: path({ type: "Sphere" }) ?? "", grid: path(graticule) ?? "", labels };
  }, [projected, view]);
  const footprints = useMemo(() => {
    if (!projected) return [];
    const path = geoPath(projected.projection);
    return outlines.flatMap((o) => {
      const d = path(outlinePolygon(o));
      return d ? [{ id: o.id, d, style: o.style, label: o.label }] : [];
    });
  }, [projected, outlines]);
  // a closed line, not a polygon: the edges are great-circle arcs either way, and no winding rule can fill the sky
  const tiles = useMemo(() => {
    if (!projected) return [];
    const path = geoPath(projected.projection);
    return planTiles.flatMap((f) => {
      const d = path({ type: "LineString", coordinates: [...f.outline, f.outline[0] ?? f.centre] });
      return d ? [{ ...f, d, at: numbered ? projected.place(f.centre[0], f.centre[1]) : null }] : [];
    });
  }, [projected, planTiles, numbered]);

  const onMove = (e: React.MouseEvent<SVGSVGElement>) => {
    if (!projected) return;
    const box = e.currentTarget.getBoundingClientRect();
    setHover(projected.skyAt(e.clientX - box.left, e.clientY - box.top));
  };

  const onClick = (e: React.MouseEvent<SVGSVGElement>) => {
    if (!projected || !onPick) return;
    const box = e.currentTarget.getBoundingClientRect();
    const at = projected.skyAt(e.clientX - box.left, e.clientY - box.top);
    if (at) onPick(at[0], at[1]);
  };

  return (
    <figure className="space-y-1">
      <div ref={wrapper} className="relative w-full" style={{ height: height || undefined }}>
        {width > 0 ? (
          <>
            <canvas ref={canvas} width={width} height={height} className="absolute left-0 top-0" aria-hidden />
            <svg
              width={width}
              height={height}
              className="absolute left-0 top-0"
              role="img"
              aria-label={title}
              onMouseMove={onMove}
              onMouseLeave={() => setHover(null)}
              onClick={onPick ? onClick : undefined}
              style={onPick ? { cursor: "crosshair" } : undefined}
            >
              <path d={overlay?.outline} fill="none" className="stroke-line-strong" strokeWidth={1} />
              <path d={overlay?.grid} fill="none" className="stroke-faint" strokeOpacity={0.35} strokeWidth={0.6} />
              {overlay?.labels.map((l) => (
                <text key={`${l.text}-${l.x}`} x={l.x} y={l.y} textAnchor={l.anchor} className="fill-muted font-mono text-[10px]">
                  {l.text}
                </text>
              ))}
              <g data-testid="sky-footprints">
                {footprints.map((f) =>
                  f.style === "observed" ? (
                    <path key={f.id} d={f.d} className="fill-fg stroke-fg" fillOpacity={0.18} strokeWidth={0.8} data-footprint="observed">
                      <title>{f.label}</title>
                    </path>
                  ) : (
                    <path key={f.id} d={f.d} fill="none" className="stroke-fg" strokeDasharray="3 2" strokeWidth={0.8} data-footprint="planned">
                      <title>{f.label}</title>
                    </path>
                  ),
                )}
              </g>
              {tiles.length ? (
                <g data-testid="plan-footprints" fill="none" strokeWidth={1.4}>
                  {tiles.map((t) => (
                    <path key={t.key} d={t.d} stroke={rgbCss(t.colour)} strokeDasharray={t.dash || undefined} data-site={t.siteCode}>
                      <title>{`${t.siteCode} pointing ${t.index}`}</title>
                    </path>
                  ))}
                  {tiles.map((t) =>
                    t.at ? (
                      <text
                        key={`n-${t.key}`}
                        x={t.at[0]}
                        y={t.at[1] + 3}
                        textAnchor="middle"
                        className="fill-fg font-mono text-[9px]"
                        paintOrder="stroke"
                        stroke="var(--c-surface)"
                        strokeWidth={2.5}
                        data-testid="footprint-number"
                      >
                        {t.index}
                      </text>
                    ) : null,
                  )}
                </g>
              ) : null}
              {markers.map((m, i) => {
                const at = projected?.place(m.raDeg, m.decDeg);
                if (!at) return null;
                return <Marker key={`${m.kind}-${i}`} x={at[0]} y={at[1]} marker={m} />;
              })}
            </svg>
          </>
        ) : null}
      </div>
      <figcaption className="flex flex-wrap justify-between gap-2 text-xs text-muted">
        <span>{title}</span>
        <span className="font-mono" aria-live="off">
          {hover ? `RA ${formatRa(hover[0])}  Dec ${formatDec(hover[1])}` : "RA increases to the left"}
        </span>
      </figcaption>
    </figure>
  );
}

function Marker({ x, y, marker }: { x: number; y: number; marker: SkyMarker }) {
  if (marker.kind === "pick") {
    return (
      <g transform={`translate(${x},${y})`} className="stroke-accent" strokeWidth={2}>
        <line x1={-5} x2={5} y1={-5} y2={5} />
        <line x1={-5} x2={5} y1={5} y2={-5} />
        <title>{marker.label}</title>
      </g>
    );
  }
  if (marker.kind === "galaxy") {
    return (
      <circle cx={x} cy={y} r={marker.radius ?? 3} className="fill-accent/40 stroke-accent" strokeWidth={1} data-testid="galaxy-mark">
        <title>{marker.label}</title>
      </circle>
    );
  }
  if (marker.kind === "peak") {
    return (
      <g transform={`translate(${x},${y})`} className="stroke-fg" strokeWidth={1.5}>
        <line x1={-6} x2={-2} y1={0} y2={0} />
        <line x1={2} x2={6} y1={0} y2={0} />
        <line x1={0} x2={0} y1={-6} y2={-2} />
        <line x1={0} x2={0} y1={2} y2={6} />
        <title>{marker.label}</title>
      </g>
    );
  }
  const sun = marker.kind === "sun";
  return (
    <g transform={`translate(${x},${y})`}>
      <circle r={sun ? 7 : 6} fill={sun ? "#facc15" : "#d4d4d8"} stroke={sun ? "#a16207" : "#52525b"} strokeWidth={1} />
      {sun ? <circle r={2} fill="#a16207" /> : null}
      <text x={10} y={4} className="fill-fg text-[11px] font-medium" paintOrder="stroke" stroke="var(--c-surface)" strokeWidth={3}>
        {marker.label}
      </text>
      <title>{marker.label}</title>
    </g>
  );
}
