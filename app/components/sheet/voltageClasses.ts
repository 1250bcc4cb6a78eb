// Line weight and hue encode the voltage level on the sheet: the higher the voltage, the heavier
// the stroke; one hue per class, taken from the app's palette tokens (app.css) so the sheet and
// the rest of the product agree. The sheet's classes are finer at the top than the general
// voltage bands: 35 to 150 kV and above 150 kV, where transmission planning draws its line.

export interface VoltageClass {
  id: "lv" | "mv" | "hv" | "ehv";
  label: string;
  /** Upper bound of the class, inclusive; Infinity for the top class. */
  upToKV: number;
  /** A CSS colour: the app's palette token, with our value for when the token is missing. */
  colour: string;
  strokePx: number;
}

export const voltageClasses: VoltageClass[] = [
  { id: "lv", label: "up to 1 kV", upToKV: 1, colour: "var(--color-kv-lv, #8a5e0c)", strokePx: 1.5 },
  { id: "mv", label: "1 to 35 kV", upToKV: 35, colour: "var(--color-kv-mv, #2f7a5c)", strokePx: 2.25 },
  { id: "hv", label: "35 to 150 kV", upToKV: 150, colour: "var(--color-kv-hv, #2b5aa8)", strokePx: 3.25 },
  { id: "ehv", label: "above 150 kV", upToKV: Infinity, colour: "var(--color-kv-ehv, #7a3e8e)", strokePx: 4.5 },
];

/** Drawn for a terminal that is not connected yet, so it cannot be mistaken for a voltage class. */
export const unconnectedStyle = { colour: "var(--color-ink-muted, #5a6573)", strokePx: 1.25 };

export function voltageClassOf(nominalKV: number | undefined): VoltageClass | undefined {
  if (nominalKV === undefined || !Number.isFinite(nominalKV) || nominalKV <= 0) return undefined;
  return voltageClasses.find((c) => nominalKV <= c.upToKV);
}

export function strokeFor(nominalKV: number | undefined): { colour: string; strokePx: number } {
  const voltageClass = voltageClassOf(nominalKV);
  return voltageClass ? { colour: voltageClass.colour, strokePx: voltageClass.strokePx } : unconnectedStyle;
}
