import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

/** Folders that ship in the product: what `next build`, `npm start` and the worker load. */
export const productFolders = ["app", "components", "lib", "db", "server"] as const;
/** Folders that only tooling may import. */
export const toolingFolders = ["fakes", "scripts", "tests", "bench"] as const;

const sourceFile = /\.(ts|tsx|mts|mjs|js)$/;

/** Every source file below the given folders of `root`, as paths relative to `root` with forward slashes. */
export function listSourceFiles(root: string, folders: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (relative: string) => {
    let entries;
    try {
      entries = readdirSync(path.join(root, relative), { withFileTypes: true });
    } catch {
      return;
    }
    for (const entry of entries) {
      const child = `${relative}/${entry.name}`;
      if (entry.isDirectory()) walk(child);
      else if (sourceFile.test(entry.name) && !entry.name.endsWith(".d.ts")) out.push(child);
    }
  };
  for (const folder of folders) walk(folder);
  return out.sort();
}

export interface ImportSite {
  specifier: string;
  /** the specifier resolved to a root-relative path, or null for a package */
  target: string | null;
  line: number;
}

const staticImport = /(?:^|[\s;])(?:import|export)\s[^'"`;]*?\bfrom\s*["']([^"']+)["']|(?:^|[\s;])import\s*["']([^"']+)["']/g;
const dynamicImport = /\bimport\(\s*([^)]*?)\s*[,)]/g;

/** The module specifiers a source text names, resolved against its file; `dynamic` lists import() whose argument is not a string literal. */
export function readImports(file: string, text: string): { imports: ImportSite[]; dynamic: number[] } {
  const lineAt = (index: number) => text.slice(0, index).split("\n").length;
  const resolve = (specifier: string): string | null => {
    if (specifier.startsWith("@/")) return specifier.slice(2);
    if (specifier.startsWith(".")) return path.posix.normalize(path.posix.join(path.posix.dirname(file), specifier));
    return null;
  };
  const imports: ImportSite[] = [];
  const dynamic: number[] = [];
  for (const match of text.matchAll(staticImport)) {
    const specifier = match[1] ?? match[2];
    if (specifier) imports.push({ specifier, target: resolve(specifier), line: lineAt(match.index ?? 0) });
  }
  for (const match of text.matchAll(dynamicImport)) {
    const argument = (match[1] ?? "").replace(/\/\*.*?\*\//g, "").trim();
    const literal = /^(["'])([^"'`]+)\1$/.exec(argument);
    if (literal?.[2]) imports.push({ specifier: literal[2], target: resolve(literal[2]), line: lineAt(match.index ?? 0) });
    else dynamic.push(lineAt(match.index ?? 0));
  }
  return { imports, dynamic };
}

export function readSource(root: string, file: string): string {
  return readFileSync(path.join(root, file), "utf8");
}
