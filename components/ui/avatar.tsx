import { cn } from "./cn";

/** Initials on a colour derived from the name, so the same person always looks the same. */
export function Avatar({ name, initials, className }: { name: string; initials?: string; className?: string }) {
  let hash = 0;
  for (const ch of name) hash = (hash * 31 + ch.charCodeAt(0)) >>> 0;
  const hue = hash % 360;
  const text = initials || name.split(/\s+/).map((p) => p[0] ?? "").join("").slice(0, 2).toUpperCase();
  return (
    <span
      title={name}
      aria-label={name}
      role="img"
      className={cn("inline-flex h-6 w-6 shrink-0 items-center justify-center rounded-full text-[10px] font-semibold text-white", className)}
      style={{ backgroundColor: `hsl(${hue} 45% 40%)` }}
    >
      {text}
    </span>
  );
}
