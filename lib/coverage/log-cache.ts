import type { SkymapMap } from "@/lib/skymap/types";
import { CoverageLog, type Coverage, type CoverageObservation } from "./curve";

interface CachedLog {
  log: CoverageLog;
  mergerMs: number;
  seen: Set<string>;
}

/**
 * One growing coverage log per sky map: a read adds only the rows it has not seen (CoverageLog adds them in place
 * unless they end before the last), so a busy night's log is not re-unioned on every refresh. A log is rebuilt
 * when a row it holds is gone or the merger time moved. Pure: the caller loads the map and the rows.
 */
export class CoverageLogCache {
  private readonly logs = new Map<string, CachedLog>();

  constructor(private readonly maxLogs = 32) {}

  coverage(skymapId: string, loadMap: () => SkymapMap, mergerTime: Date, rows: ReadonlyArray<CoverageObservation & { id: string }>): Coverage {
    let cached = this.logs.get(skymapId);
    const ids = new Set(rows.map((r) => r.id));
    const stale = cached && (cached.mergerMs !== mergerTime.getTime() || [...cached.seen].some((id) => !ids.has(id)));
    if (!cached || stale) {
      cached = { log: new CoverageLog(loadMap(), mergerTime), mergerMs: mergerTime.getTime(), seen: new Set() };
      this.logs.delete(skymapId);
      this.logs.set(skymapId, cached);
      for (const key of this.logs.keys()) {
        if (this.logs.size <= this.maxLogs) break;
        this.logs.delete(key);
      }
    }
    const fresh = rows.filter((r) => !cached.seen.has(r.id));
    if (fresh.length) {
      cached.log.add(fresh);
      for (const r of fresh) cached.seen.add(r.id);
    }
    return cached.log.result();
  }
}
