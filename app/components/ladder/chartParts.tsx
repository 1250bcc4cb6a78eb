// What the ladder's three charts share: their size (a fixed size prints and renders on the
// server; without one the chart follows its container), axis styling, and a line style per
// alternative that differs in dash and marker as well as hue.
import { cloneElement, type ReactElement } from "react";
import { ResponsiveContainer } from "recharts";

export const axisTick = { fontSize: 12, fill: "var(--color-ink-soft, #3f4b59)" };
export const axisLabel = { fontSize: 12, fill: "var(--color-ink-soft, #3f4b59)" };
export const gridStroke = "var(--color-paper-rule, #e6e1d5)";

export interface AlternativeStyle {
  colour: string;
  dash?: string;
  marker: "circle" | "square" | "diamond" | "triangle";
}

// Our own sequence: ink-blue, ochre, plum, moss, rust, slate; never the status colours.
const STYLES: AlternativeStyle[] = [
  { colour: "#1f5f7a", marker: "circle" },
  { colour: "#9a6a12", dash: "7 4", marker: "square" },
  { colour: "#7a3e8e", dash: "2 3", marker: "diamond" },
  { colour: "#3d6b4f", dash: "10 3 2 3", marker: "triangle" },
  { colour: "#a4522a", dash: "4 2", marker: "circle" },
  { colour: "#4b5563", dash: "1 2", marker: "square" },
];

export const styleOfAlternative = (index: number): AlternativeStyle => STYLES[index % STYLES.length];

/** A fixed size when `width` is given (print, server rendering), else the container's width. */
export function Sized({ width, height, children }: { width?: number; height: number; children: ReactElement<{ width?: number; height?: number }> }) {
  if (width) return cloneElement(children, { width, height });
  return (
    <ResponsiveContainer width="100%" height={height}>
      {children}
    </ResponsiveContainer>
  );
}

/** A marker drawn at (cx, cy) in the alternative's shape. */
export function Marker({ cx, cy, style, size = 4.5 }: { cx?: number; cy?: number; style: AlternativeStyle; size?: number }) {
  if (cx === undefined || cy === undefined || !Number.isFinite(cx) || !Number.isFinite(cy)) return null;
  const common = { fill: "var(--color-paper-sheet, #fcfbf7)", stroke: style.colour, strokeWidth: 2 };
  switch (style.marker) {
    case "circle":
      return <circle cx={cx} cy={cy} r={size} {...common} />;
    case "square":
      return <rect x={cx - size} y={cy - size} width={size * 2} height={size * 2} {...common} />;
    case "diamond":
      return <path d={`M ${cx} ${cy - size * 1.3} L ${cx + size * 1.3} ${cy} L ${cx} ${cy + size * 1.3} L ${cx - size * 1.3} ${cy} Z`} {...common} />;
    case "triangle":
      return <path d={`M ${cx} ${cy - size * 1.3} L ${cx + size * 1.2} ${cy + size} L ${cx - size * 1.2} ${cy + size} Z`} {...common} />;
  }
}
