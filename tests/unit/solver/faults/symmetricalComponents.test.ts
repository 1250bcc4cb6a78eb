// Symmetrical components textbook check (any power-system textbook): Z1 = Z2 = j0.15,
// Z0 = j0.20, E = 1 pu gives I3φ = E/Z1 = 6.667 pu and I1φ = 3E/(Z1 + Z2 + Z0) = 6.000 pu.
// Built as a single bus fed by an infeed whose impedance is j0.15 pu; the IEC source c·U_n/√3
// is divided out again to get E = 1 pu.
import { expect, it } from "vitest";
import { computeFaultLevels } from "#solver/faults/index.ts";
import { validateNetwork } from "#solver/schema.ts";

it("6.667 pu three-phase and 6.000 pu line to earth", () => {
  const baseMVA = 100;
  const c = 1.1; // c_max above 1 kV
  const checked = validateNetwork({
    format: "kilostep.network",
    version: 1,
    name: "textbook",
    frequencyHz: 50,
    baseMVA,
    buses: [{ id: "f", name: "Fault bus", nominalKV: 20 }],
    sources: [
      {
        id: "s",
        name: "Source",
        bus: "f",
        kind: "grid",
        control: "slack",
        // Z_Q = c·U_n²/S"kQ = j0.15 pu  ⇔  S"kQ = c·baseMVA/0.15; X/R so high that R vanishes.
        shortCircuitMVA: (c * baseMVA) / 0.15,
        xOverR: 1e12,
        z0OverZ1: 0.2 / 0.15,
      },
    ],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  const [f] = computeFaultLevels(checked.network).buses;
  const baseKA = baseMVA / (Math.sqrt(3) * 20);
  expect(f.ik3kA / baseKA / c).toBeCloseTo(6.667, 3);
  expect(f.ik1kA / baseKA / c).toBeCloseTo(6.0, 9);
  expect(f.rOverX).toBeLessThan(1e-11);
});
