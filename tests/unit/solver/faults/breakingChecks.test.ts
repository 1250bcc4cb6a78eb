// Methods: compare I"k with each bus's breakingKA; a check names the element, the values, the
// limit and the rule (IEC 60909-0 initial symmetrical current against rated breaking current).
import { describe, expect, it } from "vitest";
import { computeFaultLevels, faultChecks } from "#solver/faults/index.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";

function network(breaking: { hv?: number; lv?: number }): Network {
  const checked = validateNetwork({
    format: "kilostep.network",
    version: 1,
    name: "switchgear",
    frequencyHz: 50,
    buses: [
      { id: "hv", name: "Bay 33 kV", nominalKV: 33, breakingKA: breaking.hv },
      { id: "lv", name: "Bay 11 kV", nominalKV: 11, breakingKA: breaking.lv },
    ],
    sources: [{ id: "q", name: "Infeed", bus: "hv", kind: "grid", control: "slack", shortCircuitMVA: 500, xOverR: 10 }],
    transformers: [
      { id: "t", name: "T", hvBus: "hv", lvBus: "lv", ratedMVA: 20, hvKV: 33, lvKV: 11, impedancePct: 10, loadLossKW: 0, vectorGroup: "Dyn11" },
    ],
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.issues));
  return checked.network;
}

describe("breaking-current checks", () => {
  it("I\"k1 9.03 kA above an 8.5 kA breaker: one check naming the bus, both currents and the rule", () => {
    const net = network({ hv: 25, lv: 8.5 });
    const faults = computeFaultLevels(net);
    const checks = faultChecks(net, faults);
    expect(checks).toHaveLength(1);
    const [check] = checks;
    expect(check.element).toBe("lv");
    expect(check.kind).toBe("breaking-current");
    expect(check.limit).toBe(8.5);
    expect(check.value).toBeCloseTo(9.035, 3);
    expect(check.message).toContain('Bus "Bay 11 kV": ');
    expect(check.message).toContain('I"k3 = 8.11 kA');
    expect(check.message).toContain('I"k1 = 9.03 kA');
    expect(check.message).toContain("8.50 kA");
    expect(check.message).toContain("IEC 60909-0");
  });

  it("I\"k3 above the limit while I\"k1 is zero (unearthed side)", () => {
    const base = network({ lv: 5 });
    const net: Network = { ...base, transformers: [{ ...base.transformers[0], vectorGroup: "Dd0" }] };
    const [check] = faultChecks(net, computeFaultLevels(net));
    expect(check.element).toBe("lv");
    expect(check.value).toBeCloseTo(8.107, 3);
    expect(check.message).toMatch(/I"k3 exceeds/);
  });

  it("no check where the breaker is rated above both currents or no rating is given", () => {
    const net = network({ hv: 25, lv: 9.1 });
    expect(faultChecks(net, computeFaultLevels(net))).toEqual([]);
    const unrated = network({});
    expect(faultChecks(unrated, computeFaultLevels(unrated))).toEqual([]);
  });
});
