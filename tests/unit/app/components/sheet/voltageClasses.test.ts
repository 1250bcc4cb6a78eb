// The one set of voltage classes the sheet, the report drawing and the report's input tables
// share: up to 1 kV, 1 to 35 kV, 35 to 150 kV, above 150 kV, each bound inclusive, and the higher
// the class the heavier its stroke.
import { describe, expect, it } from "vitest";
import { strokeFor, unconnectedStyle, voltageClasses, voltageClassOf } from "#app/components/sheet/voltageClasses.ts";

describe("voltage classes", () => {
  it("put each nominal voltage in its class, bounds inclusive", () => {
    const classOf = (kv: number) => voltageClassOf(kv)?.label;
    expect(classOf(0.4)).toBe("up to 1 kV");
    expect(classOf(1)).toBe("up to 1 kV");
    expect(classOf(1.01)).toBe("1 to 35 kV");
    expect(classOf(33)).toBe("1 to 35 kV");
    expect(classOf(35)).toBe("1 to 35 kV");
    expect(classOf(66)).toBe("35 to 150 kV");
    expect(classOf(132)).toBe("35 to 150 kV");
    expect(classOf(150)).toBe("35 to 150 kV");
    expect(classOf(220)).toBe("above 150 kV");
    expect(classOf(400)).toBe("above 150 kV");
  });

  it("have no class for a voltage that is not a voltage", () => {
    for (const kv of [undefined, 0, -11, Number.NaN, Number.POSITIVE_INFINITY]) expect(voltageClassOf(kv)).toBeUndefined();
    expect(strokeFor(undefined)).toEqual(unconnectedStyle);
  });

  it("draw a heavier stroke for each higher class, each in its own hue", () => {
    const strokes = voltageClasses.map((c) => c.strokePx);
    expect([...strokes].sort((a, b) => a - b)).toEqual(strokes);
    expect(new Set(strokes).size).toBe(strokes.length);
    expect(new Set(voltageClasses.map((c) => c.colour)).size).toBe(voltageClasses.length);
    expect(strokes.every((px) => px > unconnectedStyle.strokePx)).toBe(true);
  });
});
