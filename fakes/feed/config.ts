import { existsSync, readFileSync } from "node:fs";

/** Reads KEY=VALUE lines into process.env without overriding what is already set. */
export function loadEnvFile(file: string): void {
  if (!existsSync(file)) return;
  for (const line of readFileSync(file, "utf8").split(/\r?\n/)) {
    const match = /^\s*([A-Z0-9_]+)\s*=\s*(.*?)\s*$/.exec(line);
    if (!match?.[1] || line.trimStart().startsWith("#")) continue;
    const value = (match[2] ?? "").replace(/^(['"])(.*)\1$/, "$2");
    if (process.env[match[1]] === undefined) process.env[match[1]] = value;
  }
}

/** "2/min", "1/s", "30/h" or a bare number per minute → milliseconds between posts. */
export function parseRate(rate: string): number {
  const match = /^(\d+(?:\.\d+)?)(?:\/(s|sec|min|m|h|hour))?$/.exec(rate.trim());
  if (!match?.[1]) throw new Error(`--rate must look like 2/min, 1/s or 30/h (got "${rate}")`);
  const perUnit = Number(match[1]);
  const unitMs = { s: 1000, sec: 1000, min: 60_000, m: 60_000, h: 3_600_000, hour: 3_600_000 }[match[2] ?? "min"] ?? 60_000;
  if (!(perUnit > 0)) throw new Error("--rate must be positive");
  return unitMs / perUnit;
}
