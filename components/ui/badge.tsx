import { cn } from "./cn";

type Tone = "neutral" | "accent" | "ok" | "warn" | "alarm";

const tones: Record<Tone, string> = {
  neutral: "bg-raised text-muted border-line",
  accent: "bg-accent/15 text-accent border-accent/40",
  ok: "bg-ok/15 text-ok border-ok/40",
  warn: "bg-warn/15 text-warn border-warn/40",
  alarm: "bg-alarm/15 text-alarm border-alarm/40",
};

export function Badge({ tone = "neutral", className, ...props }: React.HTMLAttributes<HTMLSpanElement> & { tone?: Tone }) {
  return (
    <span
      className={cn("inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-medium", tones[tone], className)}
      {...props}
    />
  );
}
