"use client";

import { cn } from "@/components/ui/cn";
import { layoutDay, weekDays, type DaySpan } from "@/lib/notify/rota-week";
import { formatClock, isoUtc } from "@/lib/format/time";
import type { RotaIssueJson, ShiftView } from "./types";

const DAY_HEIGHT_PX = 480;

interface Span {
  startMs: number;
  endMs: number;
}

function hourLines(day: DaySpan) {
  return Array.from({ length: 5 }, (_, i) => ({ fraction: (i * 6 * 3_600_000) / (day.endMs - day.startMs), label: `${String(i * 6).padStart(2, "0")}:00` })).filter((l) => l.fraction < 1);
}

/** Seven days in the viewer's zone, shifts as blocks (overlaps side by side), gaps hatched and labelled. */
export function WeekGrid({
  weekStart,
  timeZone,
  shifts,
  issues,
  nowMs,
  onSelect,
}: {
  weekStart: number;
  timeZone: string;
  shifts: ShiftView[];
  issues: RotaIssueJson[];
  nowMs: number;
  onSelect?: (shift: ShiftView) => void;
}) {
  const days = weekDays(weekStart, timeZone);
  const blocks = shifts.map((s) => ({ ...s, startMs: Date.parse(s.startsAt), endMs: Date.parse(s.endsAt) }));
  const overlapping = new Set(issues.flatMap((i) => (i.kind === "overlap" ? i.shiftIds : [])));
  const gaps: Span[] = issues.filter((i) => i.kind === "gap").map((g) => ({ startMs: Date.parse(g.from), endMs: Date.parse(g.to) }));
  return (
    <div className="relative overflow-x-auto" data-testid="rota-week">
      <div className="grid min-w-[56rem] grid-cols-7 gap-1">
        {days.map((day) => (
          <div key={day.key}>
            <div className="mb-1 text-center text-xs font-medium text-muted">{day.label}</div>
            <div className="relative rounded-md border border-line bg-sunken" style={{ height: DAY_HEIGHT_PX }}>
              {hourLines(day).map((line) => (
                <div key={line.label} className="absolute inset-x-0 border-t border-line/60" style={{ top: `${line.fraction * 100}%` }}>
                  <span className="pl-0.5 text-[9px] text-faint">{line.label}</span>
                </div>
              ))}
              {layoutDay(gaps, day).map((seg) => (
                <div
                  key={`gap-${seg.item.startMs}`}
                  className="absolute inset-x-0 flex items-center justify-center border-y border-alarm/50 text-[10px] font-medium text-alarm"
                  style={{
                    top: `${seg.topFraction * 100}%`,
                    height: `${seg.heightFraction * 100}%`,
                    backgroundImage: "repeating-linear-gradient(135deg, transparent 0 6px, color-mix(in srgb, var(--c-alarm) 18%, transparent) 6px 9px)",
                  }}
                  title={`Nobody on call ${isoUtc(seg.item.startMs)} – ${isoUtc(seg.item.endMs)}`}
                >
                  {seg.heightFraction > 0.06 ? "no one on call" : null}
                </div>
              ))}
              {layoutDay(blocks, day).map((seg) => {
                const s = seg.item;
                const overlap = overlapping.has(s.id);
                return (
                  <button
                    type="button"
                    key={s.id}
                    onClick={() => onSelect?.(s)}
                    disabled={!onSelect}
                    title={`${s.primary.name}${s.backup ? ` (backup ${s.backup.name})` : ""}\n${isoUtc(s.startMs)} – ${isoUtc(s.endMs)} UTC${overlap ? "\nOverlaps another shift" : ""}`}
                    className={cn(
                      "absolute overflow-hidden rounded border px-1 py-0.5 text-left text-[11px] leading-tight",
                      "border-l-[3px] bg-raised",
                      overlap ? "border-warn" : "border-accent/60",
                      seg.continuesBefore && "rounded-t-none",
                      seg.continuesAfter && "rounded-b-none",
                      onSelect && "hover:brightness-125",
                    )}
                    style={{
                      top: `${seg.topFraction * 100}%`,
                      height: `${seg.heightFraction * 100}%`,
                      left: `${(seg.lane / seg.lanes) * 100}%`,
                      width: `${100 / seg.lanes}%`,
                      borderTopStyle: seg.continuesBefore ? "dashed" : undefined,
                      borderBottomStyle: seg.continuesAfter ? "dashed" : undefined,
                    }}
                  >
                    <span className="block truncate font-semibold">{s.primary.name}</span>
                    {seg.heightFraction > 0.08 ? <span className="block truncate text-muted">{s.backup ? `backup ${s.backup.name}` : "no backup"}</span> : null}
                    {seg.heightFraction > 0.14 && !seg.continuesBefore ? <span className="block text-faint">from {formatClock(s.startMs, timeZone)}</span> : null}
                  </button>
                );
              })}
              {nowMs >= day.startMs && nowMs < day.endMs ? (
                <div className="pointer-events-none absolute inset-x-0 border-t-2 border-alarm" style={{ top: `${((nowMs - day.startMs) / (day.endMs - day.startMs)) * 100}%` }} aria-label="now" />
              ) : null}
            </div>
          </div>
        ))}
      </div>
    </div>
  );
}
