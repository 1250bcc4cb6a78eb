// fast-check generators of network files a hostile or careless sender might post: random JSON,
// valid networks (random radial ones and the demo fixtures) with one to four mutations each, and
// the text of those with its syntax damaged. Used by the fuzz tests against the solve API and the
// upload page.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { radialNetwork } from "../../solver/generators.ts";

const fixtureDir = join(import.meta.dirname, "..", "..", "..", "fixtures");
const fixtures: unknown[] = readdirSync(fixtureDir)
  .filter((f) => f.endsWith(".json"))
  .map((f) => JSON.parse(readFileSync(join(fixtureDir, f), "utf8")) as unknown);

/** Values that have broken parsers and solvers before: extremes, wrong types, odd strings. */
const nastyValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(0, -0, -1, 1e-308, 1e308, -1e308, 5e-324, 2 ** 53 + 1, 1e21, 0.1 + 0.2),
  fc.constantFrom("", " ", "NaN", "Infinity", "1e309", "__proto__", "constructor", "b-nowhere", "0x10", "\u0000", "💥".repeat(50)),
  fc.constantFrom(null, true, false, [], {}, [[[]]], { __proto__: { polluted: true } }),
  fc.jsonValue({ maxDepth: 3 }),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 40 }),
);

type Mutation =
  | { kind: "set"; path: number[]; value: unknown }
  | { kind: "delete"; path: number[] }
  | { kind: "duplicate"; path: number[] }
  | { kind: "grow"; path: number[]; times: number };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant("set" as const), path: fc.array(fc.nat(), { minLength: 1, maxLength: 4 }), value: nastyValue }),
  fc.record({ kind: fc.constant("delete" as const), path: fc.array(fc.nat(), { minLength: 1, maxLength: 4 }) }),
  fc.record({ kind: fc.constant("duplicate" as const), path: fc.array(fc.nat(), { minLength: 1, maxLength: 3 }) }),
  fc.record({ kind: fc.constant("grow" as const), path: fc.array(fc.nat(), { minLength: 1, maxLength: 2 }), times: fc.integer({ min: 2, max: 300 }) }),
);

type Container = Record<string, unknown> | unknown[];
const isContainer = (v: unknown): v is Container => v !== null && typeof v === "object";

/** Walks `path` (each number picks a key or index modulo the size) and returns the parent and key. */
function locate(root: Container, path: number[]): { parent: Container; key: string | number } | null {
  let parent: Container = root;
  for (let depth = 0; ; depth++) {
    const keys: (string | number)[] = Array.isArray(parent) ? parent.map((_, i) => i) : Object.keys(parent);
    if (keys.length === 0) return null;
    const key = keys[path[depth] % keys.length];
    const child = (parent as Record<string | number, unknown>)[key];
    if (depth === path.length - 1 || !isContainer(child)) return { parent, key };
    parent = child;
  }
}

function apply(document: unknown, mutations: Mutation[]): unknown {
  const root = structuredClone(document) as Container;
  for (const m of mutations) {
    const at = locate(root, m.path);
    if (!at) continue;
    const target = at.parent as Record<string | number, unknown>;
    if (m.kind === "set") target[at.key] = m.value;
    else if (m.kind === "delete") {
      if (Array.isArray(at.parent)) at.parent.splice(at.key as number, 1);
      else delete target[at.key];
    } else if (m.kind === "duplicate" && Array.isArray(at.parent)) at.parent.push(structuredClone(at.parent[at.key as number]));
    else if (m.kind === "grow" && Array.isArray(at.parent) && at.parent.length > 0)
      for (let i = 0; i < m.times; i++) at.parent.push(structuredClone(at.parent[i % at.parent.length]));
  }
  return root;
}

export const validDocument: fc.Arbitrary<unknown> = fc.oneof(radialNetwork as fc.Arbitrary<unknown>, fc.constantFrom(...fixtures));

export const mutatedDocument: fc.Arbitrary<unknown> = fc
  .tuple(validDocument, fc.array(mutation, { minLength: 1, maxLength: 4 }))
  .map(([document, mutations]) => apply(document, mutations));

/** Text with its syntax damaged: a cut, an inserted character, or a stretch removed. */
const damagedText: fc.Arbitrary<string> = fc
  .tuple(validDocument, fc.nat(), fc.constantFrom("", "{", "}", "[", "]", ",", ":", '"', "\\", "\u0000", "\ud800", "NaN", "\n"), fc.nat(20), fc.boolean())
  .map(([document, at, insert, remove, cut]) => {
    const text = JSON.stringify(document);
    const i = at % (text.length + 1);
    return cut ? text.slice(0, i) : text.slice(0, i) + insert + text.slice(i + remove);
  });

export interface HostileCase {
  kind: "random JSON" | "valid" | "mutated" | "damaged text";
  text: string;
}

export const hostileCase: fc.Arbitrary<HostileCase> = fc.oneof(
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }).map((v) => ({ kind: "random JSON" as const, text: JSON.stringify(v) ?? "null" })) },
  { weight: 1, arbitrary: validDocument.map((d) => ({ kind: "valid" as const, text: JSON.stringify(d) })) },
  { weight: 5, arbitrary: mutatedDocument.map((d) => ({ kind: "mutated" as const, text: JSON.stringify(d) ?? "null" })) },
  { weight: 2, arbitrary: damagedText.map((text) => ({ kind: "damaged text" as const, text })) },
);

/** How many cases a fuzz test runs: 2,000 in the ordinary suite, `npm run fuzz` asks for 10,000. */
export const FUZZ_RUNS = Number(process.env.FUZZ_RUNS ?? 2000);
