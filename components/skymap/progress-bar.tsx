/** A determinate progress bar with its percentage in text (also for screen readers). */
export function ProgressBar({ fraction, label }: { fraction: number; label: string }) {
  const pct = Math.round(Math.min(1, Math.max(0, fraction)) * 100);
  return (
    <div className="space-y-1" data-testid="upload-progress">
      <div className="flex justify-between text-xs text-muted">
        <span>{label}</span>
        <span className="font-mono" data-testid="upload-percent">
          {pct}&nbsp;%
        </span>
      </div>
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="h-2 overflow-hidden rounded bg-sunken">
        <div className="h-full bg-accent transition-[width] duration-150" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}
