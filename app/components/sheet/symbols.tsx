// Our own single-line symbols, in the spirit of IEC 60617: drawn with the terminal on the left
// and mirrored when the terminal faces right. Shared by the parts shelf and the sheet's nodes.
import type { ReactNode } from "react";
import type { Side } from "./flowModel.ts";
import type { PartKind } from "./sheetEdits.ts";

export interface SymbolStroke {
  colour: string;
  strokePx: number;
  dashed?: boolean;
}

interface FrameProps {
  width: number;
  height: number;
  side: Side;
  children: ReactNode;
  /** Drawn unmirrored on top, e.g. letters. */
  overlay?: ReactNode;
}

function Frame({ width, height, side, children, overlay }: FrameProps) {
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} className="ks-symbol" aria-hidden="true" focusable="false">
      <g transform={side === "right" ? `translate(${width} 0) scale(-1 1)` : undefined}>{children}</g>
      {overlay}
    </svg>
  );
}

const strokeProps = (s: SymbolStroke) => ({
  stroke: s.colour,
  strokeWidth: s.strokePx,
  strokeDasharray: s.dashed ? "4 3" : undefined,
  fill: "none",
  strokeLinecap: "square" as const,
});

/** x of a point drawn at `x` in terminal-left coordinates, after mirroring. */
const mirrored = (x: number, width: number, side: Side) => (side === "right" ? width - x : x);

/**
 * The grid infeed: our own sign, a transmission tower (legs, two cross-arms and a lattice brace)
 * standing for the wider network behind the connection point, fed by the connecting line at its
 * lower cross-arm.
 */
export function GridInfeedSymbol({ width, height, side, stroke }: { width: number; height: number; side: Side; stroke: SymbolStroke }) {
  const cx = width - 18;
  const top = height / 2 - 17;
  const foot = height / 2 + 17;
  const arm = height / 2 - 3;
  const tower = "var(--color-ink-soft, #3f4b59)";
  return (
    <Frame width={width} height={height} side={side}>
      <line x1={0} y1={height / 2} x2={cx - 12} y2={height / 2} {...strokeProps(stroke)} />
      <line x1={cx - 12} y1={height / 2} x2={cx - 12} y2={arm} {...strokeProps(stroke)} />
      <g stroke={tower} strokeWidth={1.6} fill="none" strokeLinejoin="round" strokeLinecap="round">
        <path d={`M ${cx - 10} ${foot} L ${cx} ${top} L ${cx + 10} ${foot}`} />
        <line x1={cx - 9} y1={top + 7} x2={cx + 9} y2={top + 7} />
        <line x1={cx - 12} y1={arm} x2={cx + 12} y2={arm} />
        <path d={`M ${cx - 6} ${arm} L ${cx + 8} ${foot - 1} M ${cx + 6} ${arm} L ${cx - 8} ${foot - 1}`} strokeWidth={1.1} />
      </g>
    </Frame>
  );
}

export function GeneratorSymbol({ width, height, side, stroke }: { width: number; height: number; side: Side; stroke: SymbolStroke }) {
  const r = 17;
  const cx = width - r - 4;
  const cy = height / 2;
  const textX = mirrored(cx, width, side);
  return (
    <Frame
      width={width}
      height={height}
      side={side}
      overlay={
        <g>
          <text x={textX} y={cy - 1} textAnchor="middle" className="ks-symbol-letter">
            G
          </text>
          <path
            d={`M ${textX - 7} ${cy + 8} q 3.5 -5 7 0 t 7 0`}
            fill="none"
            stroke="var(--color-ink, #1d2733)"
            strokeWidth={1.4}
          />
        </g>
      }
    >
      <line x1={0} y1={cy} x2={cx - r} y2={cy} {...strokeProps(stroke)} />
      <circle cx={cx} cy={cy} r={r} {...strokeProps(stroke)} strokeWidth={Math.max(1.5, stroke.strokePx * 0.8)} />
    </Frame>
  );
}

/**
 * A converter-connected plant (solar, wind, battery): a square split by its diagonal, direct
 * current (a straight stroke and a dashed one) in the far half and a sine in the half that faces
 * the network. Deliberately not a circle: the plant has no rotating machine behind it.
 */
export function ConverterSymbol({ width, height, side, stroke }: { width: number; height: number; side: Side; stroke: SymbolStroke }) {
  const size = 32;
  const x = width - size - 4;
  const y = height / 2 - size / 2;
  const ink = "var(--color-ink, #1d2733)";
  return (
    <Frame width={width} height={height} side={side}>
      <line x1={0} y1={height / 2} x2={x} y2={height / 2} {...strokeProps(stroke)} />
      <rect x={x} y={y} width={size} height={size} {...strokeProps(stroke)} strokeWidth={Math.max(1.5, stroke.strokePx * 0.8)} />
      <line x1={x} y1={y + size} x2={x + size} y2={y} stroke={ink} strokeWidth={1.2} />
      <path d={`M ${x + 4} ${y + 10} q 3 -5 6 0 t 6 0`} fill="none" stroke={ink} strokeWidth={1.4} />
      <line x1={x + 17} y1={y + 22} x2={x + 28} y2={y + 22} stroke={ink} strokeWidth={1.4} />
      <line x1={x + 17} y1={y + 26} x2={x + 28} y2={y + 26} stroke={ink} strokeWidth={1.4} strokeDasharray="2.5 2" />
    </Frame>
  );
}

export function TransformerSymbol({
  width,
  height,
  hvSide,
  hvStroke,
  lvStroke,
  tapChanger,
}: {
  width: number;
  height: number;
  hvSide: Side;
  hvStroke: SymbolStroke;
  lvStroke: SymbolStroke;
  tapChanger: boolean;
}) {
  const r = 14;
  const cy = height / 2;
  const hvX = width / 2 - 8;
  const lvX = width / 2 + 8;
  const ring = (s: SymbolStroke) => ({ ...strokeProps(s), strokeWidth: Math.max(1.5, s.strokePx * 0.75) });
  return (
    <Frame width={width} height={height} side={hvSide}>
      <line x1={0} y1={cy} x2={hvX - r} y2={cy} {...strokeProps(hvStroke)} />
      <line x1={lvX + r} y1={cy} x2={width} y2={cy} {...strokeProps(lvStroke)} />
      <circle cx={hvX} cy={cy} r={r} {...ring(hvStroke)} />
      <circle cx={lvX} cy={cy} r={r} {...ring(lvStroke)} />
      {tapChanger ? (
        // An on-load tap changer: an arrow drawn through the HV winding.
        <g stroke="var(--color-ink, #1d2733)" strokeWidth={1.3} fill="var(--color-ink, #1d2733)">
          <line x1={hvX - 12} y1={cy + 14} x2={hvX + 9} y2={cy - 13} />
          <path d={`M ${hvX + 11} ${cy - 16} l -1.5 7.5 l -5.5 -4.2 z`} stroke="none" />
        </g>
      ) : null}
    </Frame>
  );
}

export function LineSymbol({ width, height, stroke, cable }: { width: number; height: number; stroke: SymbolStroke; cable: boolean }) {
  const cy = height / 2;
  return (
    <Frame width={width} height={height} side="left">
      <line x1={0} y1={cy} x2={width} y2={cy} {...strokeProps(stroke)} />
      {cable ? (
        // A cable: the conductor drawn through its sheath.
        <ellipse cx={width / 2} cy={cy} rx={9} ry={6} fill="var(--color-paper-sheet, #fcfbf7)" stroke="var(--color-ink-soft, #3f4b59)" strokeWidth={1.3} />
      ) : (
        // An overhead line: two supports marked on the span.
        <g stroke="var(--color-ink-soft, #3f4b59)" strokeWidth={1.3}>
          <line x1={width / 3} y1={cy - 6} x2={width / 3} y2={cy + 6} />
          <line x1={(2 * width) / 3} y1={cy - 6} x2={(2 * width) / 3} y2={cy + 6} />
        </g>
      )}
      {cable ? <line x1={width / 2 - 4} y1={cy} x2={width / 2 + 4} y2={cy} {...strokeProps(stroke)} /> : null}
    </Frame>
  );
}

export function LoadSymbol({ width, height, side, stroke }: { width: number; height: number; side: Side; stroke: SymbolStroke }) {
  const cy = height / 2;
  const tip = width - 4;
  return (
    <Frame width={width} height={height} side={side}>
      <line x1={0} y1={cy} x2={tip - 14} y2={cy} {...strokeProps(stroke)} />
      <path d={`M ${tip - 16} ${cy - 8} L ${tip} ${cy} L ${tip - 16} ${cy + 8} Z`} fill={stroke.colour} stroke={stroke.colour} strokeWidth={1} strokeLinejoin="round" />
    </Frame>
  );
}

export function CapacitorSymbol({ width, height, side, stroke }: { width: number; height: number; side: Side; stroke: SymbolStroke }) {
  const cy = height / 2;
  const plate = 24;
  const gap = 7;
  const earthX = plate + gap + 14;
  return (
    <Frame width={width} height={height} side={side}>
      <line x1={0} y1={cy} x2={plate} y2={cy} {...strokeProps(stroke)} />
      <g stroke={stroke.colour} strokeWidth={2.4}>
        <line x1={plate} y1={cy - 11} x2={plate} y2={cy + 11} />
        <line x1={plate + gap} y1={cy - 11} x2={plate + gap} y2={cy + 11} />
      </g>
      <line x1={plate + gap} y1={cy} x2={earthX} y2={cy} stroke="var(--color-ink-soft, #3f4b59)" strokeWidth={1.3} />
      <g stroke="var(--color-ink-soft, #3f4b59)" strokeWidth={1.5}>
        <line x1={earthX} y1={cy - 9} x2={earthX} y2={cy + 9} />
        <line x1={earthX + 4} y1={cy - 6} x2={earthX + 4} y2={cy + 6} />
        <line x1={earthX + 8} y1={cy - 3} x2={earthX + 8} y2={cy + 3} />
      </g>
    </Frame>
  );
}

const shelfStroke: SymbolStroke = { colour: "var(--color-ink, #1d2733)", strokePx: 2 };

/** The symbol of a part as the shelf shows it. */
export function PartIcon({ part }: { part: PartKind }) {
  switch (part) {
    case "busbar":
      return (
        <svg width={64} height={44} viewBox="0 0 64 44" className="ks-symbol" aria-hidden="true" focusable="false">
          <rect x={29} y={2} width={6} height={40} fill="var(--color-ink, #1d2733)" />
          <line x1={12} y1={14} x2={29} y2={14} stroke="var(--color-ink-muted, #5a6573)" strokeWidth={1.3} />
          <line x1={35} y1={30} x2={52} y2={30} stroke="var(--color-ink-muted, #5a6573)" strokeWidth={1.3} />
        </svg>
      );
    case "grid":
      return <GridInfeedSymbol width={64} height={44} side="right" stroke={shelfStroke} />;
    case "generator":
      return <GeneratorSymbol width={64} height={44} side="right" stroke={shelfStroke} />;
    case "transformer":
      return <TransformerSymbol width={64} height={44} hvSide="left" hvStroke={shelfStroke} lvStroke={shelfStroke} tapChanger={false} />;
    case "overhead":
      return <LineSymbol width={64} height={44} stroke={shelfStroke} cable={false} />;
    case "cable":
      return <LineSymbol width={64} height={44} stroke={shelfStroke} cable />;
    case "load":
      return <LoadSymbol width={64} height={44} side="left" stroke={shelfStroke} />;
    case "capacitor":
      return <CapacitorSymbol width={64} height={44} side="left" stroke={shelfStroke} />;
  }
}
