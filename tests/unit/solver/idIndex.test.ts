// The id index agrees with a Map on any list of ids, including repeats and unicode.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { IdIndex } from "#solver/idIndex.ts";

describe("id index", () => {
  it("finds every id at its first position and nothing else, like a Map", () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: "grapheme", maxLength: 12 }), { maxLength: 300 }), fc.array(fc.string(), { maxLength: 50 }), (ids, probes) => {
        const index = new IdIndex(ids);
        const expected = new Map<string, number>();
        ids.forEach((id, i) => {
          if (!expected.has(id)) expected.set(id, i);
        });
        for (const id of [...ids, ...probes]) expect(index.get(id)).toBe(expected.get(id));
      }),
      { numRuns: 200 },
    );
  });

  it("lists every repeat with its first position, in order, like a scan with a Map", () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom("a", "b", "c", "d", "é", "𝒳", ""), { maxLength: 60 }), (ids) => {
        const first = new Map<string, number>();
        const expected: number[] = [];
        ids.forEach((id, i) => {
          const at = first.get(id);
          if (at === undefined) first.set(id, i);
          else expected.push(i, at);
        });
        expect(new IdIndex(ids).repeats).toEqual(expected);
      }),
      { numRuns: 300 },
    );
  });
});
