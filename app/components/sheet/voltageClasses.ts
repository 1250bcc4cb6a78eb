// Line weight and hue encode the voltage level on the sheet: the higher the voltage, the heavier
// the stroke; one hue per class, from our own palette (kept clear of the status colours).

export interface VoltageClass {
  id: "lv" | "mv" | "hv" | "ehv";
  label: string;
  /** Upper bound of the class, inclusive; Infinity for the top class. */
  upToKV: number;
  colour: string;
  strokePx: number;
}

export const voltageClasses: VoltageClass[] = [
  { id: "lv", label: "up to 1 kV", upToKV: 1, colour: "#8a4b82", strokePx: 1.5 },
  { id: "mv", label: "1 to 35 kV", upToKV: 35, colour: "#16736b", strokePx: 2.25 },
  { id: "hv", label: "35 to 150 kV", upToKV: 150, colour: "#2c5a9c", strokePx: 3.25 },
  { id: "ehv", label: "above 150 kV", upToKV: Infinity, colour: "#2a2a33", strokePx: 4.5 },
];

/** Drawn for a terminal that is not connected yet, so it cannot be mistaken for a voltage class. */
export const unconnectedStyle = { colour: "#8d8a80", strokePx: 1.25 };

export function voltageClassOf(nominalKV: number | undefined): VoltageClass | undefined {
  if (nominalKV === undefined || !Number.isFinite(nominalKV) || nominalKV <= 0) return undefined;
  return voltageClasses.find((c) => nominalKV <= c.upToKV);
}

export function strokeFor(nominalKV: number | undefined): { colour: string; strokePx: number } {
  const voltageClass = voltageClassOf(nominalKV);
  return voltageClass ? { colour: voltageClass.colour, strokePx: voltageClass.strokePx } : unconnectedStyle;
}
