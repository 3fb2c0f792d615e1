import { loggableMessage } from "@/db/loggable-error";
/**
 * End-of-shift handoffs are the review area's (lib/review/handoff.ts, `queueDueHandoffs(now)`); the worker calls it
 * each cycle. Loaded lazily so the worker runs before, and without, that module.
 */
type QueueDueHandoffs = (now: Date) => Promise<unknown>;

let loaded: Promise<QueueDueHandoffs | null> | null = null;

function load(log: (m: string) => void): Promise<QueueDueHandoffs | null> {
  // A variable specifier keeps the type checker and bundlers from requiring the file to exist.
  const specifier = "../review/handoff";
  loaded ??= import(/* @vite-ignore */ specifier).then(
    (mod: { queueDueHandoffs?: unknown }) => (typeof mod.queueDueHandoffs === "function" ? (mod.queueDueHandoffs as QueueDueHandoffs) : null),
    () => {
      log("lib/review/handoff.ts not found; shift handoffs are not queued");
      return null;
    },
  );
  return loaded;
}

export async function queueHandoffs(now: Date, log: (m: string) => void): Promise<void> {
  const fn = await load(log);
  if (!fn) return;
  try {
    await fn(now);
  } catch (error) {
    log(`queueDueHandoffs failed: ${loggableMessage(error)}`);
  }
}
