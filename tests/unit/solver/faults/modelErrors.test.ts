// Networks built in code can skip the schema; the fault calculation still answers with a
// reading or a message that names the element, never a bare crash.
import { describe, expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";

function twoBuses(): Network {
  const checked = validateNetwork({
    format: "kilostep.network",
    version: 1,
    name: "two buses",
    frequencyHz: 50,
    buses: [
      { id: "a", name: "A", nominalKV: 11 },
      { id: "b", name: "B", nominalKV: 11 },
    ],
    sources: [{ id: "g", name: "Grid", bus: "a", kind: "grid", control: "slack", shortCircuitMVA: 200, xOverR: 8 }],
    lines: [{ id: "l", name: "L", fromBus: "a", toBus: "b", kind: "cable", lengthKm: 2, rOhmPerKm: 0.2, xOhmPerKm: 0.1 }],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

describe("fault model errors", () => {
  it("a bus that no source reaches reads zero with the reason", () => {
    const net = twoBuses();
    const island = { ...net, lines: [] };
    const b = computeFaultLevels(island).buses[1];
    expect(b).toMatchObject({ id: "b", ik3kA: 0, ik1kA: 0, ip3kA: 0, note: "no source feeds this bus" });
  });

  it("a reference to a missing bus is named", () => {
    const net = twoBuses();
    const broken = { ...net, lines: [{ ...net.lines[0], toBus: "nowhere" }] };
    expect(() => computeFaultLevels(broken)).toThrow('line "l" refers to bus "nowhere", which does not exist');
  });

  it("a grid infeed without its short-circuit power is named", () => {
    const net = twoBuses();
    const broken = { ...net, sources: [{ ...net.sources[0], shortCircuitMVA: undefined }] };
    expect(() => computeFaultLevels(broken)).toThrow('grid infeed "g" has no shortCircuitMVA');
  });

  it("a line with zero zero-sequence impedance joins its ends in zero sequence", () => {
    // r0 = x0 = 0 is a solid zero-sequence link: Z(0) at b equals Z(0) at a (the infeed's Z_Q).
    const net = twoBuses();
    const solid = { ...net, lines: [{ ...net.lines[0], r0OhmPerKm: 0, x0OhmPerKm: 0 }] };
    const [a, b] = computeFaultLevels(solid).buses;
    const base = 100 / (Math.sqrt(3) * 11);
    // Z(1) at a is Z_Q = 1.1·100/200 pu; Z(0) at both ends is Z_Q, so 3c/|2Z(1)b + Z_Q| gives I"k1 at b.
    const zQ = (1.1 * 100) / 200;
    expect(1.1 / (a.ik3kA / base)).toBeCloseTo(zQ, 12);
    const rQ = zQ / Math.sqrt(65);
    const xQ = 8 * rQ;
    const zLine = { r: (0.4 * 100) / 121, x: (0.2 * 100) / 121 };
    const r1 = rQ + zLine.r;
    const x1 = xQ + zLine.x;
    const ik1Pu = (3 * 1.1) / Math.hypot(2 * r1 + rQ, 2 * x1 + xQ);
    expect(b.ik1kA / (ik1Pu * base) - 1).toBeCloseTo(0, 12);
  });
});
