"use client";

import { useQueryClient } from "@tanstack/react-query";
import { Map as MapIcon, TriangleAlert } from "lucide-react";
import { useMemo, useState } from "react";
import { Caution, CAUTION_TEXT } from "@/components/candidate/caution";
import { Select } from "@/components/ui/field";
import { Panel, PanelTitle } from "@/components/ui/panel";
import type { SkymapInfo } from "@/lib/data/skymaps";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { footprintOutline } from "@/lib/skymap/footprint";
import { credibleRegionPoints } from "@/lib/skymap/region";
import { useCandidateObservations } from "@/components/observations/use-observations";
import { useCandidatePlans } from "@/components/plans/use-plans";
import { ConeQuery } from "./cone-query";
import { planFootprints, siteStyles } from "./footprints";
import { DistanceFigures } from "./distance-figures";
import { formatArea, formatBytes, formatDec, formatRa, formatShare } from "./format";
import { GalaxyTargetsTable, useGalaxyTargets } from "./galaxy-targets";
import { PickedDistance, type PickedPosition } from "./picked-distance";
import { SkymapLegend } from "./legend";
import type { SkyOutline } from "./outlines";
import { zoomOn, type SkyView } from "./projection";
import { skymapKeys, siteColours } from "./query-keys";
import type { Rgb } from "./raster";
import { SkyMap, type SkyMarker } from "./sky-map";
import { SkymapUpload } from "./skymap-upload";
import { useCandidateSkymaps, useDisplayGrid, useSunMoonNow, useVisibility } from "./use-skymap-data";
import { VisibilityTable } from "./visibility-table";

const ALL_SKY: SkyView = { kind: "all-sky" };
/** Galaxies circled on the zoomed map. */
const GALAXY_MARKS = 30;
const WHITE: Rgb = [255, 255, 255];

/** The candidate's sky localisation: numbers, all-sky and zoomed maps, site visibility, cone queries, uploads. */
export function SkymapPanel({ candidateId, canUpload, timeZone }: { candidateId: string; canUpload: boolean; timeZone: string }) {
  const queryClient = useQueryClient();
  const list = useCandidateSkymaps(candidateId);
  const [chosenId, setChosenId] = useState<string | null>(null);
  const maps = list.data ?? [];
  const current = maps.find((m) => m.id === chosenId) ?? maps[0];
  const refresh = () => {
    setChosenId(null);
    void queryClient.invalidateQueries({ queryKey: skymapKeys.list(candidateId) });
    void queryClient.invalidateQueries({ queryKey: skymapKeys.visibility(candidateId) });
    void queryClient.invalidateQueries({ queryKey: skymapKeys.suggestions(candidateId) });
  };

  return (
    <Panel data-testid="skymap-panel" aria-labelledby="skymap-title">
      <div className="mb-3 flex flex-wrap items-start justify-between gap-2">
        <PanelTitle id="skymap-title" className="mb-0">
          Sky localisation
        </PanelTitle>
        {maps.length > 1 ? (
          <Select aria-label="Sky map shown" className="h-8 w-auto py-1 text-xs" value={current?.id} onChange={(e) => setChosenId(e.target.value)}>
            {maps.map((m, i) => (
              <option key={m.id} value={m.id}>
                {i === 0 ? "Newest: " : ""}
                {m.file.name} · {formatInZone(m.createdAt, timeZone)}
              </option>
            ))}
          </Select>
        ) : null}
      </div>
      {list.isLoading ? <p className="text-sm text-muted">Loading sky maps…</p> : null}
      {list.isError ? <p className="text-sm text-alarm">Could not load sky maps: {String(list.error)}</p> : null}
      {list.isSuccess && !current ? (
        <div className="flex flex-col items-center gap-3 rounded-lg border border-dashed border-line bg-sunken px-4 py-8 text-center">
          <MapIcon aria-hidden className="h-7 w-7 text-faint" />
          <p className="text-sm font-medium">No sky map yet</p>
          <p className="max-w-md text-sm text-muted">
            The feed attaches one when its localisation is ready{canUpload ? ", or upload a HEALPix FITS file here" : ""}.
          </p>
          {canUpload ? <SkymapUpload candidateId={candidateId} onUploaded={refresh} /> : null}
        </div>
      ) : null}
      {current ? (
        <SkymapDetails key={current.id} skymap={current} isNewest={current.id === maps[0]?.id} candidateId={candidateId} timeZone={timeZone} />
      ) : null}
      {current && canUpload ? (
        <div className="mt-4 border-t border-line pt-3">
          <SkymapUpload candidateId={candidateId} onUploaded={refresh} compact />
        </div>
      ) : null}
    </Panel>
  );
}

function SkymapDetails({ skymap, isNewest, candidateId, timeZone }: { skymap: SkymapInfo; isNewest: boolean; candidateId: string; timeZone: string }) {
  const grid = useDisplayGrid(skymap.id);
  const visibility = useVisibility(candidateId, true);
  const sunMoon = useSunMoonNow();
  const observed = useCandidateObservations(candidateId);
  const outlines = useMemo<SkyOutline[]>(
    () =>
      (observed.data ?? []).map((o) => ({
        id: o.id,
        ring: footprintOutline(o.footprint, o.raDeg, o.decDeg, 24).map((p) => [p.raDeg, p.decDeg] as const),
        style: "observed",
        label: `Observed ${o.filter} ${o.exposureS} s from ${isoUtc(o.startTime)}`,
      })),
    [observed.data],
  );
  const rows = useMemo(() => visibility.data?.rows ?? [], [visibility.data]);

  const plans = useCandidatePlans(candidateId);
  const openPlans = useMemo(() => (plans.data ?? []).filter((p) => p.closedAt === null), [plans.data]);
  // one colour and one line pattern per site, shared by the night bands and the planned tiles
  const styles = useMemo(() => siteStyles([...rows.map((r) => r.site.code), ...openPlans.flatMap((p) => (p.site ? [p.site.code] : []))], siteColours), [rows, openPlans]);
  const colours = useMemo(() => new Map<string, Rgb>([...styles].map(([code, style]) => [code, style.colour])), [styles]);
  const planTiles = useMemo(() => planFootprints(openPlans, styles), [openPlans, styles]);
  const plannedSites = useMemo(
    () =>
      [...new Set(openPlans.flatMap((p) => (p.site ? [p.site.code] : [])))].sort().map((code) => ({
        code,
        colour: styles.get(code)?.colour ?? WHITE,
        dash: styles.get(code)?.dash ?? "",
        count: planTiles.filter((f) => f.siteCode === code).length,
      })),
    [openPlans, styles, planTiles],
  );
  const [hidden, setHidden] = useState<ReadonlySet<string>>(new Set());
  const bands = useMemo(
    () =>
      isNewest
        ? rows.filter((r) => !hidden.has(r.site.code)).flatMap((r) =>
            r.band ? [{ ...r.band, latDeg: r.site.latitudeDeg, minAltitudeDeg: r.site.minAltitudeDeg, code: r.site.code, colour: colours.get(r.site.code) ?? WHITE }] : [],
          )
        : [],
    [rows, colours, isNewest, hidden],
  );
  const toggle = (code: string) =>
    setHidden((h) => {
      const next = new Set(h);
      if (next.has(code)) next.delete(code);
      else next.add(code);
      return next;
    });
  const [galaxySiteId, setGalaxySiteId] = useState("");
  const [picked, setPicked] = useState<PickedPosition | null>(null);
  const pick = (raDeg: number, decDeg: number) => setPicked({ raDeg: ((raDeg % 360) + 360) % 360, decDeg: Math.max(-90, Math.min(90, decDeg)) });
  const pickMark = useMemo<SkyMarker[]>(() => (picked ? [{ ...picked, kind: "pick", label: "Position picked for the distance" }] : []), [picked]);
  const galaxies = useGalaxyTargets(candidateId, galaxySiteId, isNewest && Boolean(skymap.distance));
  const galaxyMarks = useMemo<SkyMarker[]>(() => {
    const top = (galaxies.data?.galaxies ?? []).slice(0, GALAXY_MARKS);
    const best = top[0]?.normalizedScore ?? 0;
    return top.map((g, i) => ({
      raDeg: g.raDeg,
      decDeg: g.decDeg,
      kind: "galaxy" as const,
      radius: best > 0 ? 2 + 6 * Math.sqrt(g.normalizedScore / best) : 2,
      label: `#${i + 1} ${g.name}: ${formatShare(g.normalizedScore)} of the score, ${g.distanceMpc.toFixed(0)} Mpc`,
    }));
  }, [galaxies.data]);
  const zoom = useMemo(
    () => (grid.data ? zoomOn(skymap.peak, credibleRegionPoints(grid.data, { level: 0.9, maxPoints: 4096 })) : null),
    [grid.data, skymap.peak],
  );
  const markers = useMemo<SkyMarker[]>(() => {
    const list: SkyMarker[] = [{ ...skymap.peak, kind: "peak", label: `Most probable position ${formatRa(skymap.peak.raDeg)} ${formatDec(skymap.peak.decDeg)}` }];
    if (sunMoon) {
      list.push({ ...sunMoon.sun, kind: "sun", label: "Sun" });
      list.push({ ...sunMoon.moon, kind: "moon", label: `Moon ${formatShare(sunMoon.moon.illumination)} lit` });
    }
    return list;
  }, [skymap.peak, sunMoon]);

  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-3 text-sm sm:grid-cols-4" data-testid="skymap-numbers">
        <Figure label={"50\u00a0% area"} value={formatArea(skymap.area50Deg2)} testId="area50" />
        <Figure label={"90\u00a0% area"} value={formatArea(skymap.area90Deg2)} testId="area90" />
        <Figure label="Most probable RA" value={formatRa(skymap.peak.raDeg)} hint={`${skymap.peak.raDeg.toFixed(3)}°`} />
        <Figure label="Most probable Dec" value={formatDec(skymap.peak.decDeg)} hint={`${skymap.peak.decDeg.toFixed(3)}°`} />
      </dl>
      <DistanceFigures distance={skymap.distance} />
      <Caution />
      {skymap.warnings.length ? (
        <ul className="space-y-1 rounded-md border border-warn/40 bg-warn/10 px-3 py-2 text-sm" aria-label="Warnings about this sky map">
          {skymap.warnings.map((w) => (
            <li key={w} className="flex gap-2">
              <TriangleAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-warn" />
              {w}
            </li>
          ))}
        </ul>
      ) : null}
      {grid.isError ? <p className="text-sm text-alarm">Could not load the map for drawing: {String(grid.error)}</p> : null}
      {grid.data ? (
        <div className="space-y-4" data-testid="skymap-views">
          <div className="rounded-md bg-sunken p-2">
            <SkyMap grid={grid.data} view={ALL_SKY} bands={bands} markers={markers} outlines={outlines} planTiles={planTiles} aspect={2} title="All sky (Mollweide, equatorial J2000)" />
          </div>
          <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
            <div className="rounded-md bg-sunken p-2">
              {zoom ? (
                <SkyMap
                  grid={grid.data}
                  view={zoom}
                  bands={bands}
                  markers={[...galaxyMarks, ...markers, ...pickMark]}
                  onPick={skymap.distance ? pick : undefined}
                  outlines={outlines}
                  planTiles={planTiles}
                  numbered
                  aspect={1}
                  maxWidth={420}
                  title={`The 90 % region (equal-area, ${Math.round(zoom.kind === "zoom" ? 2 * zoom.radiusDeg : 0)}° across)`}
                />
              ) : null}
              {zoom && skymap.distance ? <PickedDistance skymapId={skymap.id} picked={picked} /> : null}
            </div>
            <SkymapLegend
              observedCount={outlines.length}
              plannedSites={plannedSites}
              onToggle={toggle}
              sites={(isNewest ? rows : []).map((r) => ({
                code: r.site.code,
                name: r.site.name,
                colour: colours.get(r.site.code) ?? WHITE,
                hasNight: Boolean(r.band),
                shown: Boolean(r.band) && !hidden.has(r.site.code),
              }))}
            />
          </div>
        </div>
      ) : (
        <div className="h-48 animate-pulse rounded-md bg-sunken" aria-label="Loading the map" />
      )}
      <section aria-labelledby="visibility-title" className="space-y-2">
        <h3 id="visibility-title" className="text-sm font-semibold">
          What each site can observe tonight{isNewest ? "" : " (of the newest map)"}
        </h3>
        {visibility.data ? <VisibilityTable visibility={visibility.data} colours={colours} timeZone={timeZone} /> : null}
        {visibility.isLoading ? <p className="text-sm text-muted">Working out each site&apos;s night…</p> : null}
        <p className="text-xs text-faint">
          Share of the 90&nbsp;% region&apos;s probability that reaches each site&apos;s altitude limit at some time between the end and start of
          astronomical twilight (Sun 18° below the horizon), in 10-minute steps, without refraction. The best window holds at least 90&nbsp;% of the
          largest share seen at one instant.
        </p>
      </section>
      {isNewest && skymap.distance ? (
        <section aria-labelledby="galaxies-title" className="space-y-2" data-testid="galaxy-targets">
          <h3 id="galaxies-title" className="text-sm font-semibold">
            Host galaxy candidates
          </h3>
          <GalaxyTargetsTable
            query={galaxies}
            sites={rows.map((r) => ({ id: r.site.id, code: r.site.code, name: r.site.name }))}
            siteId={galaxySiteId}
            onSiteChange={setGalaxySiteId}
            timeZone={timeZone}
          />
          <p className="text-xs text-faint">
            The {GALAXY_MARKS} best are circled on the zoomed map, sized by score. {CAUTION_TEXT}
          </p>
        </section>
      ) : null}
      <section aria-labelledby="cone-title" className="space-y-2">
        <h3 id="cone-title" className="text-sm font-semibold">
          Probability in a cone
        </h3>
        <ConeQuery skymapId={skymap.id} initial={skymap.peak} />
        <p className="text-xs text-faint">Counts the map&apos;s pixels whose centres lie inside the cone, at the file&apos;s own resolution.</p>
      </section>
      <p className="text-xs text-faint">
        {skymap.layout === "multiorder" ? "Multi-order" : skymap.layout === "flat-ring" ? "Flat RING" : "Flat NESTED"} map, {skymap.pixelCount.toLocaleString("en-US")} pixels
        {skymap.revision ? `, revision ${skymap.revision}` : ""} · file total {skymap.totalProbability.toFixed(4)} ·{" "}
        <a href={skymap.file.url} className="text-accent hover:underline">
          {skymap.file.name}
        </a>{" "}
        ({formatBytes(skymap.file.sizeBytes)}) · stored <time dateTime={isoUtc(skymap.createdAt)} title={`${isoUtc(skymap.createdAt)} (UTC)`}>{formatInZone(skymap.createdAt, timeZone)}</time>
        {skymap.uploadedBy ? ` by ${skymap.uploadedBy.name}` : " by the feed"}
      </p>
    </div>
  );
}

function Figure({ label, value, hint, testId }: { label: string; value: string; hint?: string; testId?: string }) {
  return (
    <div className="rounded-md border border-line bg-sunken px-3 py-2">
      <dt className="text-xs text-muted">{label}</dt>
      <dd className="font-mono text-base" title={hint} data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}
