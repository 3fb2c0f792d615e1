import { Mail, Smartphone } from "lucide-react";
import { Badge } from "@/components/ui/badge";
import type { Delivery } from "./types";

const tone = { sent: "ok", pending: "neutral", sending: "accent", failed: "alarm", cancelled: "neutral", skipped: "warn" } as const;

const label: Record<Delivery["status"], string> = {
  sent: "sent",
  pending: "waiting",
  sending: "sending",
  failed: "failed",
  cancelled: "not needed",
  skipped: "not sent",
};

/** What became of the push and e-mail copies of a message, with the reason on hover. */
export function DeliveryChips({ deliveries }: { deliveries: Delivery[] }) {
  if (deliveries.length === 0) return <span className="text-xs text-faint">in the app only</span>;
  return (
    <span className="flex flex-wrap gap-1">
      {deliveries.map((d) => {
        const Icon = d.channel === "push" ? Smartphone : Mail;
        const why = d.lastError ? ` — ${d.lastError}` : d.attempts > 1 ? ` after ${d.attempts} attempts` : "";
        return (
          <Badge key={d.channel} tone={tone[d.status]} title={`${d.channel}: ${label[d.status]}${why}`}>
            <Icon aria-hidden className="h-3 w-3" />
            <span className="sr-only">{d.channel}</span>
            {label[d.status]}
          </Badge>
        );
      })}
    </span>
  );
}
