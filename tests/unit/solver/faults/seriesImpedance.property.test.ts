// Property (Thévenin): on a radial chain fed from one infeed, every driving-point impedance is
// the infeed plus the series elements on the way (scaled by rated ratios squared), all with
// R, X ≥ 0; adding series impedance therefore never raises the fault current downstream of it
// and leaves everything upstream as it was. Zero-sequence earthing sits only at the upstream
// end of each zero-sequence section (infeed, Dyn/Yzn LV side), so the same holds for I"k1.
import fc from "fast-check";
import { expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

const levelsKV = [132, 33, 11, 0.4];

const lineArb = fc.record({
  kind: fc.constant("line" as const),
  lengthKm: fc.double({ min: 0.05, max: 30, noNaN: true }),
  rOhmPerKm: fc.double({ min: 0.01, max: 0.8, noNaN: true }),
  xOhmPerKm: fc.double({ min: 0.02, max: 0.5, noNaN: true }),
  r0OhmPerKm: fc.option(fc.double({ min: 0.05, max: 2, noNaN: true }), { nil: undefined }),
  x0OhmPerKm: fc.option(fc.double({ min: 0.1, max: 2, noNaN: true }), { nil: undefined }),
});
const transformerArb = fc.record({
  kind: fc.constant("transformer" as const),
  ratedMVA: fc.double({ min: 0.5, max: 100, noNaN: true }),
  impedancePct: fc.double({ min: 3, max: 18, noNaN: true }),
  xOverR: fc.double({ min: 1, max: 60, noNaN: true }),
  windingOffset: fc.double({ min: -0.1, max: 0.1, noNaN: true }),
  vectorGroup: fc.constantFrom("YNyn0", "Dyn11", "Yd1", "Dd0", "Yzn11", "Dzn0", "Yyn0"),
});
type Element = ReturnType<typeof lineArb.generate>["value"] | ReturnType<typeof transformerArb.generate>["value"];

function buildChain(elements: Element[], grid: { sk: number; xOverR: number; z0OverZ1: number }): Network {
  const doc: Required<Pick<NetworkInput, "buses" | "lines" | "transformers">> & NetworkInput = {
    format: "kilostep.network",
    version: 1,
    name: "chain",
    frequencyHz: 50,
    buses: [{ id: "b0", name: "B0", nominalKV: levelsKV[0] }],
    sources: [{ id: "q", name: "Grid", bus: "b0", kind: "grid", control: "slack", shortCircuitMVA: grid.sk, xOverR: grid.xOverR, z0OverZ1: grid.z0OverZ1 }],
    lines: [],
    transformers: [],
  };
  let level = 0;
  elements.forEach((e, i) => {
    const from = `b${i}`;
    const to = `b${i + 1}`;
    if (e.kind === "transformer" && level < levelsKV.length - 1) {
      level++;
      doc.buses.push({ id: to, name: to, nominalKV: levelsKV[level] });
      doc.transformers.push({
        id: `e${i}`, name: `T${i}`, hvBus: from, lvBus: to, ratedMVA: e.ratedMVA,
        hvKV: levelsKV[level - 1], lvKV: levelsKV[level] * (1 + e.windingOffset),
        impedancePct: e.impedancePct, xOverR: e.xOverR, vectorGroup: e.vectorGroup,
      });
    } else {
      doc.buses.push({ id: to, name: to, nominalKV: levelsKV[level] });
      const line = e.kind === "line" ? e : { lengthKm: 1, rOhmPerKm: 0.2, xOhmPerKm: 0.3, r0OhmPerKm: undefined, x0OhmPerKm: undefined };
      doc.lines.push({
        id: `e${i}`, name: `L${i}`, fromBus: from, toBus: to, kind: "overhead",
        lengthKm: line.lengthKm, rOhmPerKm: line.rOhmPerKm, xOhmPerKm: line.xOhmPerKm,
        r0OhmPerKm: line.r0OhmPerKm, x0OhmPerKm: line.x0OhmPerKm,
      });
    }
  });
  const checked = validateNetwork(doc);
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

it("adding series impedance never raises downstream fault current (fast-check)", () => {
  fc.assert(
    fc.property(
      fc.array(fc.oneof(lineArb, transformerArb), { minLength: 1, maxLength: 10 }),
      fc.record({
        sk: fc.double({ min: 20, max: 20000, noNaN: true }),
        xOverR: fc.double({ min: 0.5, max: 30, noNaN: true }),
        z0OverZ1: fc.double({ min: 0.3, max: 3, noNaN: true }),
      }),
      fc.nat(),
      fc.double({ min: 0.01, max: 5, noNaN: true }),
      (elements, grid, pick, growth) => {
        const before = buildChain(elements, grid);
        const target = pick % elements.length;
        const id = `e${target}`;
        // Grow the element: a longer line, or a transformer with more u_k at the same X/R.
        const after: Network = {
          ...before,
          lines: before.lines.map((l) => (l.id === id ? { ...l, lengthKm: l.lengthKm * (1 + growth) } : l)),
          transformers: before.transformers.map((t) => (t.id === id ? { ...t, impedancePct: t.impedancePct * (1 + growth) } : t)),
        };
        const a = computeFaultLevels(before).buses;
        const b = computeFaultLevels(after).buses;
        const slack = 1 + 1e-12;
        for (let k = 0; k < a.length; k++) {
          if (k <= target) {
            expect(b[k].ik3kA).toBeCloseTo(a[k].ik3kA, 9);
            expect(b[k].ik1kA).toBeCloseTo(a[k].ik1kA, 9);
          } else {
            expect(b[k].ik3kA).toBeLessThanOrEqual(a[k].ik3kA * slack);
            expect(b[k].ip3kA).toBeGreaterThan(0);
            expect(b[k].ik1kA).toBeLessThanOrEqual(a[k].ik1kA * slack);
          }
        }
        // The element's own far end must actually drop.
        expect(b[target + 1].ik3kA).toBeLessThan(a[target + 1].ik3kA);
      },
    ),
    { numRuns: 300 },
  );
});
