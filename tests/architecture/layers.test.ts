import { describe, expect, it } from "vitest";
import { listSourceFiles, productFolders, readImports, readSource } from "@/tests/support/source-tree";

const root = process.cwd();
const within = (target: string, folder: string) => target === folder || target.startsWith(`${folder}/`);

/** Storage is the bottom layer: it may not call up into the areas that use it. */
const aboveStorage = ["lib/notify", "lib/review", "lib/feed", "lib/triage", "lib/services"];

/** Files that still break the storage rule. Each entry must still break it (the list only shrinks) and nothing new may join. */
const storageStillCallingUp: string[] = [];
/** The configuration module: the one product file that reads the environment. */
const configModule = "lib/env.ts";

function storageOffenders(): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const file of listSourceFiles(root, ["lib/data"])) {
    const bad = readImports(file, readSource(root, file))
      .imports.filter((site) => site.target !== null && aboveStorage.some((folder) => within(site.target as string, folder)))
      .map((site) => `${file}:${site.line} imports ${site.specifier}`);
    if (bad.length) out.set(file, bad);
  }
  return out;
}

/**
 * Code that reads process.env, ignoring comments (a comment may say why a value is not read from it) and plain
 * assignments (server/peer-address.mjs tells the configuration that requests are stamped by setting a variable).
 */
function readsEnv(text: string): boolean {
  const code = text
    .replace(/\/\*[\s\S]*?\*\//g, "")
    .replace(/(^|[^:"'`])\/\/.*$/gm, "$1")
    .replace(/\bprocess\.env\.[A-Z_][A-Z0-9_]*\s*=(?!=)/g, "");
  return /\bprocess\.env\b/.test(code);
}

describe("storage sits at the bottom", () => {
  it("finds the storage files", () => {
    expect(listSourceFiles(root, ["lib/data"])).toContain("lib/data/tasks.ts");
  });

  it("no lib/data file imports lib/notify, lib/review, lib/feed, lib/triage or lib/services (beyond the shrinking list)", () => {
    const offenders = storageOffenders();
    const fresh = [...offenders].filter(([file]) => !storageStillCallingUp.includes(file)).flatMap(([, lines]) => lines);
    expect(fresh).toEqual([]);
    const fixed = storageStillCallingUp.filter((file) => !offenders.has(file));
    expect(fixed, "these files obey the rule now: take them off storageStillCallingUp").toEqual([]);
  });

  it("the checker sees an upward import", () => {
    const { imports } = readImports("lib/data/x.ts", 'import { a } from "@/lib/notify/hooks";\nimport { b } from "../review/facts";');
    expect(imports.map((i) => i.target).filter((t) => t !== null && aboveStorage.some((f) => within(t, f)))).toEqual(["lib/notify/hooks", "lib/review/facts"]);
  });
});

/** Product files outside lib/data and db/ that import drizzle-orm (its query builder, operators or sql tag). */
function queryBuilders(): string[] {
  return listSourceFiles(root, productFolders)
    .filter((file) => !within(file, "lib/data") && !within(file, "db"))
    .filter((file) => readImports(file, readSource(root, file)).imports.some((site) => /^drizzle-orm(\/|$)/.test(site.specifier)));
}

describe("queries live in storage", () => {
  it("no product file outside lib/data and db/ imports drizzle-orm", () => {
    expect(queryBuilders()).toEqual([]);
  });

  it("the checker sees drizzle's sql tag and operators", () => {
    const text = 'import { sql } from "drizzle-orm";\nimport { eq } from "drizzle-orm/sql";\nimport { x } from "drizzle-ormish";';
    expect(readImports("lib/notify/x.ts", text).imports.filter((site) => /^drizzle-orm(\/|$)/.test(site.specifier)).length).toBe(2);
  });
});

describe("configuration is read in one place", () => {
  it("the configuration module reads the environment", () => {
    expect(readsEnv(readSource(root, configModule))).toBe(true);
  });

  it("no other product file reads process.env", () => {
    const readers = listSourceFiles(root, productFolders).filter((file) => file !== configModule && readsEnv(readSource(root, file)));
    expect(readers).toEqual([]);
  });

  it("the checker ignores comments", () => {
    expect(readsEnv("// process.env is not read here\nconst a = 1;")).toBe(false);
    expect(readsEnv("/* process.env */ const a = process.env.X;")).toBe(true);
  });

  it("the checker tells an assignment from a read", () => {
    expect(readsEnv('process.env.PEER_HEADER = "x";')).toBe(false);
    expect(readsEnv('if (process.env.PEER_HEADER === "x") go();')).toBe(true);
    expect(readsEnv("const { A } = process.env;")).toBe(true);
  });
});
