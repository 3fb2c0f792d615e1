import type { Stage, TriageState } from "@/db/schema";
import { ingestCandidate } from "@/lib/services/ingest-trigger";
import type { SessionUser } from "@/lib/auth/roles";
import { listSiteOptions } from "@/lib/data/tasks";
import { createTasks } from "@/lib/services/create-tasks";
import { transitionCandidate } from "@/lib/services/move-card";
import { taskKinds } from "@/db/schema";
import { candidatePayload } from "./candidate-payload";

/** A deterministic spread of fictional candidates over the board's columns (for the benchmark and local looks). */
export async function seedBoardCandidates(count: number, now: Date, actor: SessionUser | null, prefix = "BX"): Promise<string[]> {
  const ids: string[] = [];
  const stages: Stage[] = ["first-look", "early-warning", "confirmed", "revised", "first-look", "withdrawn"];
  const masses: Array<[number, number]> = [
    [1.5, 1.3],
    [1.4, 1.35],
    [8, 1.4],
    [30, 25],
    [12, 9],
    [3.8, 2.1],
  ];
  const states: TriageState[] = ["new", "acknowledged", "reviewing", "pursue", "dismissed", "expert"];
  const sites = await listSiteOptions();
  for (let i = 0; i < count; i++) {
    const receivedAt = new Date(now.getTime() - (count - i) * 47_000);
    const [mass1, mass2] = masses[i % masses.length] ?? [1.4, 1.3];
    const stage = stages[i % stages.length] ?? "first-look";
    const early = stage === "early-warning";
    const eventTime = new Date(receivedAt.getTime() + (early ? 120_000 : -5_000));
    const payload = candidatePayload({
      externalId: `${prefix}${String(i + 1).padStart(4, "0")}`,
      stage,
      eventTime,
      mass1,
      mass2,
      trackSeconds: mass1 > 5 ? 0.6 : 8,
      falseAlarmRatePerYear: 10 ** (-(i % 7)),
      networkSnr: 8 + (i % 13),
    });
    const result = await ingestCandidate(payload, receivedAt);
    ids.push(result.id);
    const target = states[(i * 7) % states.length] ?? "new";
    if (actor && target !== "new" && !(target === "pursue" && stage === "withdrawn")) {
      await transitionCandidate({ actor, candidateId: result.id, to: target, reason: "seeded", via: "api", now: receivedAt });
      if (target === "pursue") {
        const site = sites[i % Math.max(1, sites.length)];
        const drafts = [0, 1].map((k) => ({
          kind: taskKinds[(i + k) % taskKinds.length] ?? "other",
          siteId: k === 0 ? (site?.id ?? null) : null,
          windowStart: new Date(now.getTime() + 3600_000),
          windowEnd: new Date(now.getTime() + 9 * 3600_000),
          priority: 1 + ((i + k) % 3),
          notes: k === 0 ? "Tile the 90 % region, brightest galaxies first" : "",
        }));
        await createTasks(actor, result.id, drafts, receivedAt);
      }
    }
  }
  return ids;
}
