// The single-pass validator against the zod schema it mirrors (the reference here): on valid
// documents and on documents broken at random places, both must give the same network (defaults
// filled in, texts trimmed) or the same issues, with the same messages and paths, in the same order.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { validateNetwork, validateNetworkWithSchema, type NetworkInput } from "#solver/schema.ts";
import { radialNetwork } from "../generators.ts";
import { validFixtures } from "../fixtures.ts";

const RUNS = Number(process.env.FUZZ_RUNS ?? 200);

/** A valid document, sometimes as version 2 with operating cases and growth that name what exists. */
const validDocument = fc.tuple(radialNetwork, fc.boolean(), fc.nat(), fc.double({ min: 0, max: 3, noNaN: true })).map(([doc, withCases, pick, scale]) => {
  if (!withCases) return doc as Record<string, unknown>;
  const loads = doc.loads ?? [];
  const sources = doc.sources ?? [];
  const lines = doc.lines ?? [];
  return {
    ...doc,
    version: 2,
    cases: [
      { id: "peak", name: " Peak ", hoursPerYear: 2000, loadScale: scale, loads: loads.length ? { [loads[pick % loads.length].id]: 1.1 } : {} },
      {
        id: "light",
        name: "Light",
        sources: sources.length ? { [sources[pick % sources.length].id]: { pMW: 1, inService: true } } : {},
        outOfService: lines.length ? [lines[pick % lines.length].id] : [],
      },
    ],
    growth: { ratePctPerYear: 2, years: 10 },
    ...equipment(doc, pick),
  } as Record<string, unknown>;
});

/** The version 2 equipment fields: a bus's minimum fault level, the weakest infeed, a converter plant, a regulating tap. */
function equipment(doc: NetworkInput, pick: number): Partial<NetworkInput> {
  const buses = doc.buses.map((b, i) => (i === pick % doc.buses.length ? { ...b, minFaultMVA: 50 } : b));
  const grid = (doc.sources ?? []).map((s) => (s.kind === "grid" ? { ...s, shortCircuitMinMVA: 1500 } : s));
  const plant = { id: "pv", name: " Solar park ", bus: doc.buses[pick % doc.buses.length].id, kind: "converter" as const, control: (["pq", "pv", "pf"] as const)[pick % 3], pMW: 2, powerFactor: pick % 3 === 2 ? -0.95 : undefined, qMinMvar: -1, qMaxMvar: 1, ratedMVA: 2.2, faultCurrentPct: 120 };
  const transformers = (doc.transformers ?? []).map((t, i) =>
    i === 0 ? { ...t, tapMinPct: -10, tapMaxPct: 10, tapStepPct: 1.25, tapControl: { bus: t.lvBus, targetPu: 1.0, bandPu: 0.02 } } : t,
  );
  return { buses, sources: [...grid, plant], transformers };
}

const anyValue = fc.oneof(
  fc.constantFrom<unknown>(undefined, null, true, false, 0, -0, 1e-4, 0.05, 0.5, 1, 1.5, 2, 50, 60, 100, 101, 8784, 1e300, -1, -1e20, 1e20, 2.5),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 4 }),
  fc.constantFrom("", "  ", " b0 ", "grid", "slack", "pv", "generator", "cable", "constant-current", "Dyn11", "YNd13", "Yd0", "kilostep.network", "x".repeat(101), "😀".repeat(101), "😀".repeat(201)),
  fc.array(fc.integer(), { maxLength: 3 }),
  fc.constant<unknown>({}),
  fc.dictionary(fc.constantFrom("a", "b0", "id", "pMW", "length"), fc.oneof(fc.integer(), fc.string({ maxLength: 2 })), { maxKeys: 3 }),
  fc.constant<unknown>(Array.from({ length: 101 }, (_, i) => ({ id: `c${i}`, name: "C" }))),
);

/** One edit at a place chosen among every object and list in the document. */
const edit = fc.record({ where: fc.nat(), which: fc.nat(), kind: fc.constantFrom("set", "set", "set", "delete", "unknown", "drop", "copy"), value: anyValue });
type Edit = typeof edit extends fc.Arbitrary<infer T> ? T : never;

function containers(value: unknown, into: unknown[] = []): unknown[] {
  if (value !== null && typeof value === "object") {
    into.push(value);
    for (const child of Object.values(value)) containers(child, into);
  }
  return into;
}

function applyEdit(doc: unknown, e: Edit): void {
  const all = containers(doc);
  const target = all[e.where % all.length] as Record<string, unknown> | unknown[];
  const keys = Object.keys(target);
  if (Array.isArray(target)) {
    const i = keys.length ? e.which % keys.length : 0;
    if (e.kind === "drop") target.splice(i, 1);
    else if (e.kind === "copy" && keys.length) target.push(structuredClone(target[i]));
    else target[i] = structuredClone(e.value);
    return;
  }
  const key = keys.length ? keys[e.which % keys.length] : "id";
  if (e.kind === "delete" || e.kind === "drop") delete target[key];
  else if (e.kind === "unknown") target[`extra${e.which % 3}`] = structuredClone(e.value);
  else target[key] = structuredClone(e.value);
}

function agree(input: unknown): void {
  expect(validateNetwork(input)).toEqual(validateNetworkWithSchema(input));
}

describe("single-pass validator against the zod schema", () => {
  it("agrees on every fixture", () => {
    const fixtures = validFixtures();
    expect(fixtures.length).toBeGreaterThan(0);
    for (const f of fixtures) agree(f.document);
  });

  it("agrees on random valid documents (fast-check)", () => {
    fc.assert(
      fc.property(validDocument, (doc) => {
        const fast = validateNetwork(doc);
        expect(fast.ok).toBe(true);
        expect(fast).toEqual(validateNetworkWithSchema(doc));
      }),
      { numRuns: Math.ceil(RUNS / 4) },
    );
  });

  it("agrees on documents broken at random places (fast-check)", () => {
    fc.assert(
      fc.property(validDocument, fc.array(edit, { minLength: 1, maxLength: 4 }), (doc, edits) => {
        const broken = structuredClone(doc) as NetworkInput;
        for (const e of edits) applyEdit(broken, e);
        agree(broken);
      }),
      { numRuns: RUNS },
    );
  });

  it("agrees on whatever is not a document", () => {
    fc.assert(fc.property(fc.anything(), (value) => agree(value)), { numRuns: Math.ceil(RUNS / 4) });
  });
});
