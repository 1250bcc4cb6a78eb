// Readings printed with fixed decimals, so numbers keep their place as they change.

export function fixed(value: number | null | undefined, digits: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  const text = value.toFixed(digits);
  // A reading that rounds to zero is zero, not "−0.00".
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text.replace("-", "−");
}

/** Arrow for a flow along the drawing: rightwards when it runs from the left-hand terminal. */
export function flowArrow(valueFromEnd: number, fromSide: "left" | "right"): string {
  if (Math.abs(valueFromEnd) < 1e-9) return "·";
  const rightwards = (valueFromEnd > 0) === (fromSide === "left");
  return rightwards ? "▶" : "◀";
}
