// Which way a flow runs on the drawing.

/** Arrow for a flow along the drawing: rightwards when it runs from the left-hand terminal. */
export function flowArrow(valueFromEnd: number, fromSide: "left" | "right"): string {
  if (Math.abs(valueFromEnd) < 1e-9) return "·";
  const rightwards = (valueFromEnd > 0) === (fromSide === "left");
  return rightwards ? "▶" : "◀";
}
