// The arrows between the top-level folders point one way: the app may use db/ and solver/, db/
// uses neither the app nor the tests, and nothing the app ships imports a test file. Checked on
// every import specifier (static and dynamic) of every source file.
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = resolve(import.meta.dirname, "..", "..");

function sourceFiles(folder: string): string[] {
  return readdirSync(join(ROOT, folder)).flatMap((name) => {
    const path = join(folder, name);
    if (name === "+types" || name === "node_modules") return [];
    if (statSync(join(ROOT, path)).isDirectory()) return sourceFiles(path);
    return /\.(ts|tsx)$/.test(name) ? [path] : [];
  });
}

/** Each import's target as a path from the repository root (bare packages are left out). */
function importTargets(file: string): string[] {
  const text = readFileSync(join(ROOT, file), "utf8");
  const specifiers = [...text.matchAll(/(?:from\s+|import\s*\(\s*|import\s+)["']([^"']+)["']/g)].map((m) => m[1]);
  return specifiers.flatMap((spec) => {
    const alias = /^#(app|db|solver)\/(.*)$/.exec(spec);
    if (alias) return [`${alias[1]}/${alias[2]}`];
    if (spec.startsWith(".")) return [relative(ROOT, resolve(ROOT, file, "..", spec))];
    return [];
  });
}

function offending(folder: string, forbidden: string[]): string[] {
  return sourceFiles(folder).flatMap((file) =>
    importTargets(file)
      .filter((target) => forbidden.some((top) => target === top || target.startsWith(`${top}/`)))
      .map((target) => `${file} → ${target}`),
  );
}

describe("dependency arrows", () => {
  it("db/ imports nothing from app/ or tests/", () => {
    expect(offending("db", ["app", "tests"])).toEqual([]);
  });

  it("app/ imports nothing from tests/", () => {
    expect(offending("app", ["tests"])).toEqual([]);
  });

  it("solver/ imports nothing from app/, db/ or tests/", () => {
    expect(offending("solver", ["app", "db", "tests"])).toEqual([]);
  });

  it("sees the imports it checks (the app does use db/)", () => {
    expect(offending("app", ["db"]).length).toBeGreaterThan(0);
  });
});
