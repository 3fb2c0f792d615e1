"use client";

import { useDraggable } from "@dnd-kit/core";
import { Check, GripVertical, MoreHorizontal } from "lucide-react";
import Link from "next/link";
import { memo } from "react";
import { CAUTION_TEXT } from "@/components/candidate/caution";
import { ClassBar } from "@/components/candidate/class-bar";
import { StageBadge } from "@/components/candidate/stage-badge";
import { Avatar } from "@/components/ui/avatar";
import { cn } from "@/components/ui/cn";
import type { BoardCard, BoardData } from "@/lib/data/candidates";
import { chirpStatus, chirpStatusSentence, chirpStatusShort, type ChirpModel } from "@/lib/format/chirp-status";
import { formatFalseAlarmRate, formatFalseAlarmRateExact } from "@/lib/format/far";
import { formatPercent } from "@/lib/format/numbers";
import { formatClock, formatInZone, isoUtc } from "@/lib/format/time";
import { formatWithUncertainty, SOLAR_MASS_UNIT } from "@/lib/format/uncertainty";
import { AckTimer, Age, MergerCountdown } from "./card-timers";

/** Short model tags for the card; the title and the candidate page spell them out. */
const modelTags: Record<ChirpModel, string> = { "pn-3.5": "3.5PN", "leading-order": "LO" };

interface CardProps {
  card: BoardCard;
  deadlines: BoardData["deadlines"];
  timeZone: string;
  onActions?: (id: string) => void;
  /** one tap: New → Acknowledged (shown to those who triage, on cards waiting in New) */
  onAcknowledge?: (id: string) => void;
}

/** What a card shows; memoised so a drag (which re-renders every draggable) does not redraw 500 card bodies. */
export const TriageCardBody = memo(function TriageCardBody({ card, deadlines, timeZone, onActions, onAcknowledge }: CardProps) {
  const status = chirpStatus({
    fitted: card.chirpMassDetectorFrame !== null,
    chirpMassError: card.chirpMassError,
    model: card.chirpModel,
    reducedChiSquare: card.chirpReducedChiSquare,
  });
  return (
    <div className="min-w-0 flex-1 space-y-1.5">
      <div className="flex items-center gap-1.5">
        <Link
          href={`/candidates/${card.id}`}
          className={cn("truncate font-mono text-[13px] font-semibold tracking-tight hover:underline", card.withdrawn && "line-through decoration-alarm")}
          title={card.externalId}
          prefetch={false}
        >
          {card.externalId}
        </Link>
        {onActions ? (
          <button
            type="button"
            onClick={() => onActions(card.id)}
            className="ml-auto rounded p-0.5 text-muted hover:bg-raised hover:text-fg"
            aria-label={`Actions for candidate ${card.externalId}`}
            data-testid="card-actions"
          >
            <MoreHorizontal aria-hidden className="h-4 w-4" />
          </button>
        ) : null}
      </div>
      <div className="flex flex-wrap items-center gap-x-2 gap-y-1 text-xs text-muted">
        <StageBadge stage={card.stage} />
        <span className="text-faint" title={`Revision ${card.revision}`}>
          r{card.revision}
        </span>
        <time dateTime={isoUtc(card.receivedAt)} title={`Received ${formatInZone(card.receivedAt, timeZone)} (${isoUtc(card.receivedAt)})`}>
          {formatClock(card.receivedAt, timeZone, { zone: false })} · <Age since={card.receivedAt} />
        </time>
      </div>
      {card.stage === "early-warning" ? <MergerCountdown eventTime={card.eventTime} coalescenceTimeS={card.coalescenceTimeS} /> : null}
      <ClassBar p={card.classes} />
      <dl className="space-y-0.5 text-xs" title={CAUTION_TEXT}>
        <div className="flex gap-1.5">
          <dt className="shrink-0 text-faint" title="Chirp mass, detector frame">
            𝓜<sub>det</sub>
          </dt>
          {/* The value and its unit are one unbreakable piece; only the fit's tag may go to the next line. */}
          <dd className="flex min-w-0 flex-wrap items-baseline gap-x-1 tabular-nums leading-tight">
            {card.chirpMassDetectorFrame === null ? (
              <span className={status.kind === "not-fitted" ? "" : "text-warn"} data-testid="card-chirp-status" title={chirpStatusSentence(status) ?? undefined}>
                {chirpStatusShort(status)}
              </span>
            ) : (
              <>
                <span className="whitespace-nowrap">
                  {formatWithUncertainty(card.chirpMassDetectorFrame, card.chirpMassDetectorFrameSd)}
                  <span className="text-faint">{`\u00a0${SOLAR_MASS_UNIT}`}</span>
                </span>
                <span
                  className={status.kind === "fitted" && status.poorFit ? "text-warn" : "text-faint"}
                  data-testid="card-chirp-status"
                  title={status.kind === "fitted" && status.poorFit ? status.poorFit : `Fitted with the ${chirpStatusShort(status)}`}
                >
                  {status.kind === "fitted" && status.poorFit ? "poor fit" : status.kind === "fitted" && status.model ? modelTags[status.model] : null}
                </span>
              </>
            )}
          </dd>
        </div>
        <div className="flex gap-1.5">
          <dt className="shrink-0 text-faint" title="Probability of astrophysical origin">
            p-astro
          </dt>
          <dd className="tabular-nums">{card.pAstro === null ? "—" : formatPercent(card.pAstro)}</dd>
        </div>
        <div className="flex gap-1.5">
          <dt className="shrink-0 text-faint">FAR</dt>
          <dd className="tabular-nums" title={formatFalseAlarmRateExact(card.falseAlarmRatePerYear)}>
            {formatFalseAlarmRate(card.falseAlarmRatePerYear)}
          </dd>
        </div>
      </dl>
      <div className="flex flex-wrap items-center gap-x-2 gap-y-1">
        <span className="font-mono text-xs text-muted" aria-label={`Detectors ${card.detectors.join(", ")}`}>
          {card.detectors.join(" ")}
        </span>
        <span
          className={card.triggerCount > 1 ? "text-xs text-fg" : "text-xs text-faint"}
          title="Search pipelines that reported this signal (their triggers are grouped into this candidate)"
          data-testid="pipeline-count"
        >
          {card.triggerCount} pipeline{card.triggerCount === 1 ? "" : "s"}
        </span>
        {card.liveTaskCount > 0 ? <span className="text-xs text-accent">{card.liveTaskCount} task{card.liveTaskCount === 1 ? "" : "s"}</span> : null}
        <span className="ml-auto flex items-center gap-1.5">
          {/* A withdrawn candidate's paging has stopped: it is never late, and the card says why it waits. */}
          {card.withdrawn ? (
            <span className="text-xs font-semibold text-alarm" data-testid="withdrawn-note">
              Withdrawn · paging stopped
            </span>
          ) : card.triageState === "new" ? (
            <AckTimer receivedAt={card.receivedAt} deadlines={deadlines} />
          ) : card.acknowledgedBy ? (
            <span
              className="max-w-32 truncate text-xs text-muted"
              data-testid="acknowledged-by"
              title={`Acknowledged by ${card.acknowledgedBy.name}${card.acknowledgedAt ? ` at ${formatClock(card.acknowledgedAt, timeZone)}` : ""}`}
            >
              Ack. {card.acknowledgedBy.name}
            </span>
          ) : null}
          {card.owner ? <Avatar name={card.owner.name} initials={card.owner.initials} /> : null}
        </span>
      </div>
      {onAcknowledge && card.triageState === "new" && !card.withdrawn ? (
        <button
          type="button"
          onClick={() => onAcknowledge(card.id)}
          className="flex w-full items-center justify-center gap-1 rounded border border-accent/60 bg-accent/10 px-2 py-1 text-xs font-medium text-fg hover:bg-accent/20"
          data-testid="card-acknowledge"
          aria-label={`Acknowledge candidate ${card.externalId}`}
        >
          <Check aria-hidden className="h-3.5 w-3.5" />
          Acknowledge
        </button>
      ) : null}
    </div>
  );
});

/** A card on the board: the whole card follows the mouse; the grip is the keyboard handle. */
export function DraggableTriageCard({ card, canDrag, ...props }: CardProps & { canDrag: boolean }) {
  const { setNodeRef, setActivatorNodeRef, listeners, attributes, isDragging } = useDraggable({
    id: card.id,
    disabled: !canDrag,
  });
  return (
    <article
      ref={setNodeRef}
      {...(canDrag ? listeners : {})}
      data-card-id={card.id}
      data-testid="triage-card"
      aria-label={`Candidate ${card.externalId}${card.withdrawn ? ", withdrawn" : ""}`}
      className={cn(
        "flex gap-1 rounded-md border bg-surface p-2 shadow-sm [contain-intrinsic-size:auto_9rem] [content-visibility:auto]",
        card.withdrawn ? "border-alarm/40 bg-alarm/5" : "border-line",
        isDragging && "opacity-40",
        canDrag && "touch-none",
      )}
    >
      {canDrag ? (
        <button
          type="button"
          ref={setActivatorNodeRef}
          {...attributes}
          aria-label={`Move candidate ${card.externalId}`}
          className="-ml-1 flex w-4 shrink-0 cursor-grab items-start justify-center rounded pt-0.5 text-faint hover:text-fg active:cursor-grabbing"
          data-testid="card-handle"
          data-focus-handle
        >
          <GripVertical aria-hidden className="h-4 w-4" />
        </button>
      ) : null}
      <TriageCardBody card={card} {...props} />
    </article>
  );
}
