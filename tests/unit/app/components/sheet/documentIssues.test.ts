import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { documentIssues } from "#app/components/sheet/documentIssues.ts";
import { placePart } from "#app/components/sheet/sheetEdits.ts";
import { NEAR_LIMIT_FRACTION, upperLimitStatus, voltageStatus, worstStatus } from "#app/lib/limitStatus.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

describe("document issues", () => {
  it("finds none in the demo", () => {
    expect(documentIssues(demo())).toEqual([]);
  });

  it("names every loose terminal once, in words, tied to its element and field", () => {
    const placed = placePart({ document: demo(), layout: {} }, "transformer", { x: 0, y: 300 });
    const issues = documentIssues(placed.document);
    expect(issues).toEqual([
      { elementId: placed.id, field: "hvBus", message: 'Transformer "Transformer 1": connect its HV terminal to a busbar' },
      { elementId: placed.id, field: "lvBus", message: 'Transformer "Transformer 1": connect its LV terminal to a busbar' },
    ]);
  });

  it("passes on the validator's rules with the element they concern", () => {
    const doc = demo();
    const bad = { ...doc, lines: doc.lines.map((l) => (l.id === "l-town" ? { ...l, toBus: "b-calder-66" } : l)) };
    const issues = documentIssues(bad);
    // the line now joins 11 kV to 66 kV, and the town bus is cut off from the slack
    expect(issues).toHaveLength(2);
    expect(issues[0]).toMatchObject({ elementId: "l-town", field: "toBus" });
    expect(issues[0].message).toMatch(/within one voltage level/);
    expect(issues[1]).toMatchObject({ elementId: "b-town" });
    expect(issues[1].message).toMatch(/no slack source/);
  });

  it("prefixes shape errors with the element's name", () => {
    const doc = demo();
    const bad = { ...doc, buses: doc.buses.map((b, i) => (i === 0 ? { ...b, nominalKV: -11 } : b)) };
    const [issue] = documentIssues(bad);
    expect(issue.elementId).toBe("b-tarn-11");
    expect(issue.message.startsWith("Tarn Head 11 kV: nominalKV")).toBe(true);
  });
});

describe("reading status (near a limit = within 2 % of it)", () => {
  it("grades bus voltages against their band", () => {
    expect(NEAR_LIMIT_FRACTION).toBe(0.02);
    expect(voltageStatus(1.0, 0.95, 1.05)).toBe("within");
    expect(voltageStatus(0.96, 0.95, 1.05)).toBe("near"); // 0.95 × 1.02 = 0.969
    expect(voltageStatus(0.97, 0.95, 1.05)).toBe("within");
    expect(voltageStatus(1.03, 0.95, 1.05)).toBe("near"); // 1.05 × 0.98 = 1.029
    expect(voltageStatus(0.949, 0.95, 1.05)).toBe("beyond");
    expect(voltageStatus(1.051, 0.95, 1.05)).toBe("beyond");
  });

  it("grades loading and fault current against an upper limit", () => {
    expect(upperLimitStatus(97, 100, "pct")).toBe("within");
    expect(upperLimitStatus(98, 100, "pct")).toBe("near");
    expect(upperLimitStatus(100.5, 100, "pct")).toBe("beyond");
    expect(upperLimitStatus(null, 100, "pct")).toBeUndefined();
    expect(upperLimitStatus(12, undefined, "pct")).toBeUndefined();
  });

  it("takes the worst of several", () => {
    expect(worstStatus(["within", "near", undefined])).toBe("near");
    expect(worstStatus(["within", "beyond", "near"])).toBe("beyond");
    expect(worstStatus([undefined])).toBeUndefined();
  });
});
