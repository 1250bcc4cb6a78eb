// The sparse selected inverse against mathjs's dense inverse of the same nodal admittance
// matrix: meshed graphs, off-nominal ratios, parallel branches, zero-impedance links and
// groups with no path to the reference.
import { add, complex, divide, inv, zeros, type Complex, type Matrix } from "mathjs";
import { describe, expect, it } from "vitest";
import { NodalNetworkBuilder, type NodalNetwork } from "#solver/faults/nodalNetwork.ts";
import { drivingPointImpedances } from "#solver/faults/zbusDiagonal.ts";
import { seededRandom } from "./randomNetworks.ts";

/** A network written out branch by branch, as the tests state it. */
interface Description {
  nodeCount: number;
  branches: { from: number; to: number; zRe: number; zIm: number; ratioFrom: number }[];
  shunts: { node: number; zRe: number; zIm: number }[];
}

function nodal(d: Description): NodalNetwork {
  const builder = new NodalNetworkBuilder(d.nodeCount, d.branches.length, d.shunts.length);
  for (const b of d.branches) builder.branch(b.from, b.to, b.zRe, b.zIm, b.ratioFrom);
  for (const s of d.shunts) builder.shunt(s.node, s.zRe, s.zIm);
  return builder.build();
}

/** Dense reference: stamp Y with mathjs complex numbers and invert; merged nodes by hand. */
function denseDiagonal(net: Description, nodes: number[]): Complex[] {
  const at = new Map(nodes.map((n, i) => [n, i]));
  const Y = zeros(nodes.length, nodes.length, "dense") as Matrix;
  const stamp = (i: number, j: number, v: Complex) => Y.set([i, j], add(complex(Y.get([i, j]) as Complex), v));
  for (const b of net.branches) {
    const y = divide(complex(1, 0), complex(b.zRe, b.zIm)) as Complex;
    const f = at.get(b.from)!;
    const t = at.get(b.to)!;
    stamp(f, f, divide(y, b.ratioFrom ** 2) as Complex);
    stamp(t, t, y);
    stamp(f, t, divide(y, -b.ratioFrom) as Complex);
    stamp(t, f, divide(y, -b.ratioFrom) as Complex);
  }
  for (const s of net.shunts) stamp(at.get(s.node)!, at.get(s.node)!, divide(complex(1, 0), complex(s.zRe, s.zIm)) as Complex);
  const Z = inv(Y) as Matrix;
  return nodes.map((_, i) => complex(Z.get([i, i]) as Complex));
}

function randomMesh(seed: number, nodeCount: number, extraBranches: number): Description {
  const rnd = seededRandom(seed);
  const net: Description = { nodeCount, branches: [], shunts: [] };
  const branch = (from: number, to: number) =>
    net.branches.push({
      from,
      to,
      zRe: rnd() < 0.1 ? 0 : 0.001 + rnd() * 0.5,
      zIm: 0.01 + rnd() * 0.8,
      ratioFrom: rnd() < 0.3 ? 0.85 + rnd() * 0.3 : 1,
    });
  for (let k = 1; k < nodeCount; k++) branch(Math.floor(rnd() * k), k);
  for (let e = 0; e < extraBranches; e++) {
    const a = Math.floor(rnd() * nodeCount);
    const b = Math.floor(rnd() * nodeCount);
    if (a !== b) branch(a, b);
  }
  const shuntCount = 1 + Math.floor(rnd() * 3);
  for (let s = 0; s < shuntCount; s++)
    net.shunts.push({ node: Math.floor(rnd() * nodeCount), zRe: rnd() * 0.05, zIm: 0.02 + rnd() * 0.3 });
  return net;
}

describe("drivingPointImpedances", () => {
  it("a two-node example worked by hand: Z_11 = z_s + z_b/t² seen from the far end", () => {
    // Shunt j0.1 at node 0, ideal 1.05:1 then j0.2 to node 1: from node 1, j0.1/1.05² + j0.2.
    const z = drivingPointImpedances(
      nodal({
        nodeCount: 2,
        branches: [{ from: 0, to: 1, zRe: 0, zIm: 0.2, ratioFrom: 1.05 }],
        shunts: [{ node: 0, zRe: 0, zIm: 0.1 }],
      }),
    );
    expect(z.zIm[0]).toBeCloseTo(0.1, 14);
    expect(z.zIm[1]).toBeCloseTo(0.1 / 1.05 ** 2 + 0.2, 14);
    expect(z.zRe[1]).toBeCloseTo(0, 14);
  });

  it("agrees with mathjs's dense inverse to 1e-10 on random meshes with off-nominal ratios", () => {
    for (let seed = 1; seed <= 60; seed++) {
      const net = randomMesh(seed, 5 + (seed % 30), seed % 12);
      const got = drivingPointImpedances(nodal(net));
      const want = denseDiagonal(net, [...Array(net.nodeCount).keys()]);
      want.forEach((w, k) => {
        expect(got.reachesReference[k]).toBe(1);
        expect(Math.abs(got.zRe[k] - w.re), `seed ${seed} node ${k}`).toBeLessThan(1e-10);
        expect(Math.abs(got.zIm[k] - w.im), `seed ${seed} node ${k}`).toBeLessThan(1e-10);
      });
    }
  });

  it("merges nodes joined by a zero impedance and leaves groups without a reference unbounded", () => {
    const net: Description = {
      nodeCount: 6,
      branches: [
        { from: 0, to: 1, zRe: 0.01, zIm: 0.1, ratioFrom: 1 },
        { from: 1, to: 2, zRe: 0, zIm: 0, ratioFrom: 1 },
        { from: 2, to: 3, zRe: 0.02, zIm: 0.05, ratioFrom: 1 },
        { from: 4, to: 5, zRe: 0.02, zIm: 0.05, ratioFrom: 1 },
        // In parallel with the solid link: carries nothing, changes nothing.
        { from: 1, to: 2, zRe: 0.03, zIm: 0.07, ratioFrom: 1 },
      ],
      shunts: [{ node: 0, zRe: 0.001, zIm: 0.02 }],
    };
    const got = drivingPointImpedances(nodal(net));
    const merged: Description = {
      nodeCount: 3,
      branches: [
        { from: 0, to: 1, zRe: 0.01, zIm: 0.1, ratioFrom: 1 },
        { from: 1, to: 2, zRe: 0.02, zIm: 0.05, ratioFrom: 1 },
      ],
      shunts: [{ node: 0, zRe: 0.001, zIm: 0.02 }],
    };
    const want = denseDiagonal(merged, [0, 1, 2]);
    for (const [node, m] of [[0, 0], [1, 1], [2, 1], [3, 2]] as const) {
      expect(got.zRe[node]).toBeCloseTo(want[m].re, 12);
      expect(got.zIm[node]).toBeCloseTo(want[m].im, 12);
    }
    expect([...got.reachesReference]).toEqual([1, 1, 1, 1, 0, 0]);
  });

  it("a radial network is eliminated without fill: 10,000 nodes well within a second", () => {
    const n = 10_000;
    const rnd = seededRandom(7);
    const net: Description = { nodeCount: n, branches: [], shunts: [{ node: 0, zRe: 0.001, zIm: 0.01 }] };
    for (let k = 1; k < n; k++) net.branches.push({ from: Math.max(0, k - 1 - Math.floor(rnd() * 3)), to: k, zRe: 0.001, zIm: 0.002, ratioFrom: 1 });
    const started = performance.now();
    const z = drivingPointImpedances(nodal(net));
    expect(performance.now() - started).toBeLessThan(1000);
    expect(z.reachesReference.every((v) => v === 1)).toBe(true);
    // Along any path the driving-point impedance only grows (series sum in a tree).
    for (const b of net.branches) expect(z.zIm[b.to]).toBeGreaterThan(z.zIm[b.from]);
  });
});
