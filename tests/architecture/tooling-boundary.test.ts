import { describe, expect, it } from "vitest";
import { listSourceFiles, productFolders, readImports, readSource, toolingFolders } from "@/tests/support/source-tree";

const root = process.cwd();
const productFiles = listSourceFiles(root, productFolders);
const isTooling = (target: string) => toolingFolders.some((folder) => target === folder || target.startsWith(`${folder}/`));

describe("the checker itself", () => {
  it("resolves aliases and relative paths, and tells literal from computed dynamic imports", () => {
    const text = [
      'import { a } from "@/fakes/feed/generator";',
      'import type { B } from "../../tests/support/server";',
      'export { c } from "./sibling";',
      'import "side-effect-package";',
      "const m = await import(\"@/scripts/demo/candidates\");",
      "const n = await import(/* hidden */ specifier);",
    ].join("\n");
    const { imports, dynamic } = readImports("lib/notify/worker.ts", text);
    expect(imports.map((i) => i.target)).toEqual(["fakes/feed/generator", "tests/support/server", "lib/notify/sibling", null, "scripts/demo/candidates"]);
    expect(dynamic).toEqual([6]);
    expect(imports.filter((i) => i.target !== null && isTooling(i.target))).toHaveLength(3);
  });
});

describe("the product leaves dev tooling out", () => {
  it("finds the product's files", () => {
    expect(productFiles.length).toBeGreaterThan(200);
    expect(productFiles).toContain("lib/api/handler.ts");
  });

  it("imports nothing from fakes/, scripts/, tests/ or bench/", () => {
    const offenders = productFiles.flatMap((file) =>
      readImports(file, readSource(root, file))
        .imports.filter((site) => site.target !== null && isTooling(site.target))
        .map((site) => `${file}:${site.line} imports ${site.specifier}`),
    );
    expect(offenders).toEqual([]);
  });

  it("has no import() whose module name is computed", () => {
    const offenders = productFiles.flatMap((file) => readImports(file, readSource(root, file)).dynamic.map((line) => `${file}:${line}`));
    expect(offenders).toEqual([]);
  });

  it("keeps every file under 400 lines", () => {
    const long = productFiles
      .map((file) => ({ file, lines: readSource(root, file).split("\n").length }))
      .filter(({ lines }) => lines > 400)
      .map(({ file, lines }) => `${file}: ${lines} lines`);
    expect(long).toEqual([]);
  });
});
