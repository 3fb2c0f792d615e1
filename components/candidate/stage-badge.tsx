import { Ban, CircleCheck, Eye, History, Zap } from "lucide-react";
import type { Stage } from "@/db/schema/candidates";
import { Badge } from "@/components/ui/badge";

export const stageLabels: Record<Stage, string> = {
  "early-warning": "Early warning",
  "first-look": "First look",
  confirmed: "Confirmed",
  revised: "Revised",
  withdrawn: "Withdrawn",
};

const icons = { "early-warning": Zap, "first-look": Eye, confirmed: CircleCheck, revised: History, withdrawn: Ban } as const;

export function StageBadge({ stage }: { stage: Stage }) {
  const Icon = icons[stage];
  const tone = stage === "withdrawn" ? "alarm" : stage === "early-warning" ? "warn" : stage === "confirmed" ? "ok" : "neutral";
  return (
    <Badge tone={tone}>
      <Icon aria-hidden className="h-3 w-3" />
      {stageLabels[stage]}
    </Badge>
  );
}
