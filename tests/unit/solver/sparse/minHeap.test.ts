// The orderings' heap against a plain sort: whatever is pushed comes out by key, equal keys by
// value, and the key of each entry popped is left in lastKey.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MinHeap } from "#solver/sparse/minHeap.ts";

describe("MinHeap", () => {
  it("pops every pushed pair in the order a sort by (key, value) gives", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 50 })), { maxLength: 200 }), (pairs) => {
        const heap = new MinHeap();
        for (const [key, value] of pairs) heap.push(key, value);
        expect(heap.size).toBe(pairs.length);
        const popped: [number, number][] = [];
        while (heap.size > 0) {
          const value = heap.pop();
          popped.push([heap.lastKey, value]);
        }
        expect(popped).toEqual([...pairs].sort((a, b) => a[0] - b[0] || a[1] - b[1]));
      }),
    );
  });

  it("keeps its order when pushes and pops interleave, as an elimination does", () => {
    const heap = new MinHeap();
    heap.push(3, 7);
    heap.push(1, 9);
    heap.push(1, 2);
    expect([heap.pop(), heap.lastKey]).toEqual([2, 1]);
    heap.push(0, 5);
    heap.push(2, 1);
    expect([heap.pop(), heap.pop(), heap.pop(), heap.pop()]).toEqual([5, 9, 1, 7]);
    expect(heap.size).toBe(0);
  });

  it("says so when popped empty, instead of returning nothing", () => {
    expect(() => new MinHeap().pop()).toThrow("empty heap");
  });
});
