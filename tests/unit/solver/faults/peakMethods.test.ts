// The method IEC 60909-0 (section 8.1) prescribes for i_p, by the network at the fault: one radial
// path (κ from R/X of Z_k), separate branches (sum of partial peaks, each with its own κ), meshed
// (method C, f_c = 20 Hz at 50 Hz and 24 Hz at 60 Hz). Each expected figure is worked here from
// those formulas; the tree's admittances are checked against mathjs's dense inverse.
import { add, complex, divide, inv, zeros, type Complex, type Matrix } from "mathjs";
import { describe, expect, it } from "vitest";
import { NodalNetworkBuilder } from "#solver/faults/nodalNetwork.ts";
import {
  atFrequencyRatio,
  classifyPeakPaths,
  equivalentFrequencyRatio,
  kappaEquivalentFrequency,
} from "#solver/faults/peakMethods.ts";
import { drivingPointImpedances } from "#solver/faults/zbusDiagonal.ts";

const kappa = (rOverX: number) => 1.02 + 0.98 * Math.exp(-3 * rOverX);
const branchPeak = (r: number, x: number) => kappa(r / x) / Math.hypot(r, x);

interface Branch { from: number; to: number; r: number; x: number; ratio?: number }
interface Shunt { node: number; r: number; x: number }

function build(nodeCount: number, branches: Branch[], shunts: Shunt[]) {
  const b = new NodalNetworkBuilder(nodeCount, branches.length, shunts.length);
  for (const x of branches) b.branch(x.from, x.to, x.r, x.x, x.ratio ?? 1);
  for (const s of shunts) b.shunt(s.node, s.r, s.x);
  return b.build();
}

describe("peak current method by network (IEC 60909-0, 8.1)", () => {
  it("one source behind a line: radial, κ from R/X of Z_k", () => {
    const net = build(2, [{ from: 0, to: 1, r: 0.05, x: 0.2 }], [{ node: 0, r: 0.01, x: 0.1 }]);
    const paths = classifyPeakPaths(net);
    expect(paths.method).toEqual(["radial", "radial"]);
    expect(paths.branchPeakPu[1]).toBeCloseTo(branchPeak(0.06, 0.3), 12);
    expect(paths.branchPeakPu[0]).toBeCloseTo(branchPeak(0.01, 0.1), 12);
  });

  it("a grid and a generator on either side of the fault: sum of the partial peak currents", () => {
    // grid j0.1 + 0.01 at bus 0, line 0.05 + j0.2 to bus 1; generator 0.002 + j0.25 at bus 2,
    // line 0.1 + j0.1 to bus 1. At bus 1 the partial currents come by separate branches.
    const net = build(
      3,
      [
        { from: 0, to: 1, r: 0.05, x: 0.2 },
        { from: 2, to: 1, r: 0.1, x: 0.1 },
      ],
      [
        { node: 0, r: 0.01, x: 0.1 },
        { node: 2, r: 0.002, x: 0.25 },
      ],
    );
    const paths = classifyPeakPaths(net);
    expect(paths.method[1]).toBe("branch-sum");
    expect(paths.branchPeakPu[1]).toBeCloseTo(branchPeak(0.06, 0.3) + branchPeak(0.102, 0.35), 12);
    // At bus 0 the grid's own branch and the generator's path via bus 1 are separate as well.
    expect(paths.method[0]).toBe("branch-sum");
    expect(paths.branchPeakPu[0]).toBeCloseTo(branchPeak(0.01, 0.1) + branchPeak(0.152, 0.55), 12);
  });

  it("two sources that join before the fault: meshed, method C", () => {
    const net = build(
      2,
      [{ from: 0, to: 1, r: 0.05, x: 0.2 }],
      [
        { node: 0, r: 0.01, x: 0.1 },
        { node: 0, r: 0.002, x: 0.25 },
      ],
    );
    const paths = classifyPeakPaths(net);
    expect(paths.method[1]).toBe("equivalent-frequency");
    expect(paths.method[0]).toBe("branch-sum");
  });

  it("a ring or a parallel pair makes every bus of the group meshed", () => {
    const ring = build(
      3,
      [
        { from: 0, to: 1, r: 0.05, x: 0.2 },
        { from: 1, to: 2, r: 0.05, x: 0.2 },
        { from: 2, to: 0, r: 0.05, x: 0.2 },
      ],
      [{ node: 0, r: 0.01, x: 0.1 }],
    );
    expect(classifyPeakPaths(ring).method).toEqual(["equivalent-frequency", "equivalent-frequency", "equivalent-frequency"]);
    const pair = build(
      2,
      [
        { from: 0, to: 1, r: 0.05, x: 0.2 },
        { from: 0, to: 1, r: 0.05, x: 0.3 },
      ],
      [{ node: 0, r: 0.01, x: 0.1 }],
    );
    expect(classifyPeakPaths(pair).method).toEqual(["equivalent-frequency", "equivalent-frequency"]);
  });

  it("method C on a single series impedance gives back κ of its R/X (R/X = R/(0.4X)·0.4)", () => {
    expect(equivalentFrequencyRatio(50)).toBeCloseTo(20 / 50, 15);
    expect(equivalentFrequencyRatio(60)).toBeCloseTo(24 / 60, 15);
    const net = build(1, [], [{ node: 0, r: 0.03, x: 0.2 }]);
    const zc = drivingPointImpedances(atFrequencyRatio(net, 0.4));
    expect(kappaEquivalentFrequency(zc.zRe[0], zc.zIm[0], 0.4)).toBeCloseTo(kappa(0.15), 12);
  });

  it("on a radial tree with off-nominal ratios, Σ|branch admittances| matches 1/Z_kk from mathjs where one branch feeds", () => {
    const branches: Branch[] = [
      { from: 0, to: 1, r: 0.02, x: 0.3, ratio: 1.05 },
      { from: 1, to: 2, r: 0.2, x: 0.25 },
      { from: 1, to: 3, r: 0.1, x: 0.12 },
      { from: 4, to: 3, r: 0.01, x: 0.2, ratio: 0.97 },
    ];
    const shunts: Shunt[] = [{ node: 0, r: 0.005, x: 0.05 }];
    const paths = classifyPeakPaths(build(5, branches, shunts));
    const Y = zeros(5, 5, "dense") as Matrix;
    const stamp = (i: number, j: number, v: Complex) => Y.set([i, j], add(complex(Y.get([i, j]) as Complex), v));
    for (const b of branches) {
      const y = divide(complex(1, 0), complex(b.r, b.x)) as Complex;
      const n = b.ratio ?? 1;
      stamp(b.from, b.from, divide(y, n * n) as Complex);
      stamp(b.to, b.to, y);
      stamp(b.from, b.to, divide(y, -n) as Complex);
      stamp(b.to, b.from, divide(y, -n) as Complex);
    }
    for (const s of shunts) stamp(s.node, s.node, divide(complex(1, 0), complex(s.r, s.x)) as Complex);
    const Z = inv(Y) as Matrix;
    for (let k = 0; k < 5; k++) {
      const z = complex(Z.get([k, k]) as Complex);
      expect(paths.method[k]).toBe("radial");
      expect(paths.branchPeakPu[k]).toBeCloseTo(branchPeak(z.re, z.im), 9);
    }
  });
});
