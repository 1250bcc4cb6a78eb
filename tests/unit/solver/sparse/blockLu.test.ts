// The sparse 2×2-block LU against mathjs's dense LU solve on random graphs, and its promise of
// no fill-in on radial networks.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { lusolve } from "mathjs";
import { BlockFactor } from "#solver/sparse/blockLu.ts";
import { analyse, type Graph } from "#solver/sparse/ordering.ts";

function graphOf(n: number, edges: [number, number][]): Graph {
  const sets = Array.from({ length: n }, () => new Set<number>());
  for (const [a, b] of edges) {
    if (a === b) continue;
    sets[a].add(b);
    sets[b].add(a);
  }
  const rowStart = new Int32Array(n + 1);
  const neighbours: number[] = [];
  sets.forEach((s, i) => {
    neighbours.push(...[...s].sort((x, y) => x - y));
    rowStart[i + 1] = neighbours.length;
  });
  return { nodeCount: n, rowStart, neighbours: Int32Array.from(neighbours) };
}

const treeWithExtraEdges = fc
  .integer({ min: 1, max: 40 })
  .chain((n) =>
    fc.record({
      n: fc.constant(n),
      parents: fc.array(fc.nat(), { minLength: n - 1, maxLength: n - 1 }),
      extra: fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 8 }),
      seed: fc.integer(),
    }),
  );

function randomMatrix(graph: Graph, seed: number) {
  let state = seed >>> 0 || 1;
  const random = () => {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    return ((state >>> 0) / 4294967296) * 2 - 1;
  };
  const n = graph.nodeCount;
  const dense = Array.from({ length: 2 * n }, () => Array(2 * n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let e = graph.rowStart[i]; e < graph.rowStart[i + 1]; e++) {
      const j = graph.neighbours[e];
      for (let a = 0; a < 2; a++) for (let b = 0; b < 2; b++) dense[2 * i + a][2 * j + b] = random();
    }
  }
  // Diagonal blocks large enough that no pivot block is near singular.
  for (let i = 0; i < 2 * n; i++) dense[i][i] = 4 * (graph.rowStart[(i >> 1) + 1] - graph.rowStart[i >> 1] + 1) + random();
  for (let i = 0; i < n; i++) {
    dense[2 * i][2 * i + 1] = random();
    dense[2 * i + 1][2 * i] = random();
  }
  return dense;
}

function factorOf(graph: Graph, dense: number[][]): BlockFactor {
  const factor = new BlockFactor(analyse(graph));
  const put = (target: Float64Array, slot: number, i: number, j: number) => {
    target[4 * slot] = dense[2 * i][2 * j];
    target[4 * slot + 1] = dense[2 * i][2 * j + 1];
    target[4 * slot + 2] = dense[2 * i + 1][2 * j];
    target[4 * slot + 3] = dense[2 * i + 1][2 * j + 1];
  };
  for (let i = 0; i < graph.nodeCount; i++) {
    for (let a = 0; a < 2; a++) for (let b = 0; b < 2; b++) factor.diagonal[4 * i + 2 * a + b] = dense[2 * i + a][2 * i + b];
    for (let e = graph.rowStart[i]; e < graph.rowStart[i + 1]; e++) {
      const j = graph.neighbours[e];
      put(factor.isUpper(i, j) ? factor.upper : factor.lower, factor.slotOf(i, j), i, j);
    }
  }
  return factor;
}

describe("sparse block LU", () => {
  it("solves like mathjs's dense LU on random trees with extra edges (rings, meshes)", () => {
    fc.assert(
      fc.property(treeWithExtraEdges, ({ n, parents, extra, seed }) => {
        const edges: [number, number][] = parents.map((p, k) => [k + 1, p % (k + 1)]);
        edges.push(...extra);
        const graph = graphOf(n, edges);
        const dense = randomMatrix(graph, seed);
        const rhs = Array.from({ length: 2 * n }, (_, i) => Math.sin(i + seed));
        const factor = factorOf(graph, dense);
        expect(factor.factorise()).toBe(true);
        const x = Float64Array.from(rhs);
        factor.solve(x);
        const expected = (lusolve(dense, rhs) as number[][]).map((row) => row[0]);
        expected.forEach((value, i) => expect(Math.abs(x[i] - value)).toBeLessThan(1e-10 * Math.max(1, Math.abs(value))));
      }),
      { numRuns: 60 },
    );
  });

  it("creates no fill-in on a radial network: one slot per branch and no updates", () => {
    fc.assert(
      fc.property(fc.array(fc.nat(), { minLength: 1, maxLength: 300 }), (parents) => {
        const n = parents.length + 1;
        const graph = graphOf(n, parents.map((p, k) => [k + 1, p % (k + 1)]));
        const symbolic = analyse(graph);
        expect(symbolic.slotStart[n]).toBe(n - 1);
        expect(symbolic.updateLower.length).toBe(0);
      }),
      { numRuns: 50 },
    );
  });

  it("reports a singular pivot instead of dividing by zero", () => {
    const graph = graphOf(2, [[0, 1]]);
    const factor = factorOf(graph, [
      [1, 0, 1, 0],
      [0, 1, 0, 1],
      [1, 0, 1, 0],
      [0, 1, 0, 1],
    ]);
    expect(factor.factorise()).toBe(false);
  });
});
