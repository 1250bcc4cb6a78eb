// The network as a static left-to-right single-line drawing, for the study report and for
// choosing the ladder's section. Symbols are the sheet's own, so the report reads like the sheet;
// line weight and hue follow the voltage class there too.
import type { KeyboardEvent } from "react";
import {
  CapacitorSymbol,
  ConverterSymbol,
  GeneratorSymbol,
  GridInfeedSymbol,
  LineSymbol,
  LoadSymbol,
  TransformerSymbol,
  type SymbolStroke,
} from "#app/components/sheet/symbols.tsx";
import { strokeFor } from "#app/components/sheet/voltageClasses.ts";
import type { Network } from "#solver/schema.ts";
import { ATTACHMENT_TEXT_OFFSET, layoutSingleLine, type LoopBranch, type PlacedAttachment, type PlacedBranch, type PlacedBus, type SingleLineLayout } from "./singleLineLayout.ts";

const SYMBOL_WIDTH = 56;
// The stub and symbol sizes here and ATTACHMENT_TEXT_OFFSET in the layout must agree.
const SYMBOL_HEIGHT = 44;

export interface SingleLineDrawingProps {
  network: Network;
  /** The layout when the server computed it already (off the request thread); else laid out here. */
  layout?: SingleLineLayout;
  /** Short readings written under each bus's voltage, e.g. "1.040 pu". */
  busNotes?: Record<string, string>;
  /** Buses drawn on a wash, e.g. the section the ladder re-rates. */
  highlightBusIds?: readonly string[];
  /** When given, every bus is a button that picks it. */
  onPickBus?: (busId: string) => void;
  pickLabel?: (busName: string) => string;
  /** Accessible name of the drawing. */
  label: string;
  className?: string;
}

const stroke = (kv: number): SymbolStroke => strokeFor(kv);
const kvLabel = (kv: number) => `${Number(kv.toPrecision(6))} kV`;

export function SingleLineDrawing({ network, layout: laidOut, busNotes, highlightBusIds = [], onPickBus, pickLabel, label, className }: SingleLineDrawingProps) {
  const layout = laidOut ?? layoutSingleLine(network);
  const highlighted = new Set(highlightBusIds);
  return (
    <svg
      viewBox={`${layout.minX} 0 ${layout.width} ${layout.height}`}
      className={["ks-sld", className].filter(Boolean).join(" ")}
      style={{ maxWidth: layout.width }}
      role={onPickBus ? "group" : "img"}
      aria-label={label}
    >
      {layout.branches
        .filter((b) => highlighted.has(b.leftBusId) && highlighted.has(b.rightBusId))
        .map((b) => (
          <rect key={`halo-${b.id}`} x={b.x1} y={b.y - 16} width={b.x2 - b.x1} height={32} className="ks-sld-halo" />
        ))}
      {layout.buses
        .filter((b) => highlighted.has(b.id))
        .map((b) => (
          <rect key={`halo-${b.id}`} x={b.x - 16} y={b.yTop - 4} width={32} height={b.yBottom - b.yTop + 8} rx={4} className="ks-sld-halo" />
        ))}
      {layout.branches.map((b) => (
        <Branch key={b.id} branch={b} />
      ))}
      {layout.loops.map((loop) => (
        <Loop key={loop.id} loop={loop} />
      ))}
      {layout.attachments.map((a) => (
        <Attachment key={a.id} attachment={a} />
      ))}
      {layout.buses.map((b) => (
        <Bus
          key={b.id}
          bus={b}
          note={busNotes?.[b.id]}
          highlighted={highlighted.has(b.id)}
          onPick={onPickBus}
          pickLabel={pickLabel}
        />
      ))}
    </svg>
  );
}

function Bus({
  bus,
  note,
  highlighted,
  onPick,
  pickLabel,
}: {
  bus: PlacedBus;
  note?: string;
  highlighted: boolean;
  onPick?: (busId: string) => void;
  pickLabel?: (busName: string) => string;
}) {
  const s = stroke(bus.nominalKV);
  const barWidth = Math.max(5, s.strokePx * 2);
  const drawing = (
    <>
      <rect x={bus.x - barWidth / 2} y={bus.yTop} width={barWidth} height={bus.yBottom - bus.yTop} fill={s.colour} />
      <text x={bus.x} y={bus.yTop - 22} textAnchor="middle" className="ks-sld-name">
        {bus.name}
      </text>
      <text x={bus.x} y={bus.yTop - 8} textAnchor="middle" className="ks-sld-detail">
        {kvLabel(bus.nominalKV)}
        {note ? ` · ${note}` : ""}
      </text>
    </>
  );
  if (!onPick) return <g>{drawing}</g>;
  const pick = () => onPick(bus.id);
  const onKeyDown = (event: KeyboardEvent) => {
    if (event.key === "Enter" || event.key === " ") {
      event.preventDefault();
      pick();
    }
  };
  return (
    <g
      role="button"
      tabIndex={0}
      aria-pressed={highlighted}
      aria-label={pickLabel ? pickLabel(bus.name) : bus.name}
      className="ks-sld-pick"
      onClick={pick}
      onKeyDown={onKeyDown}
    >
      <rect x={bus.x - 20} y={bus.yTop - 40} width={40} height={bus.yBottom - bus.yTop + 48} className="ks-sld-hit" />
      {drawing}
    </g>
  );
}

function Branch({ branch: b }: { branch: PlacedBranch }) {
  const left = stroke(b.leftKV);
  const right = stroke(b.rightKV);
  const mid = (b.x1 + b.x2) / 2;
  const symbolX = mid - SYMBOL_WIDTH / 2;
  const symbolY = b.y - SYMBOL_HEIGHT / 2;
  const hvStroke = b.hvOnLeft ? left : right;
  const lvStroke = b.hvOnLeft ? right : left;
  return (
    <g>
      <line x1={b.x1} y1={b.y} x2={symbolX} y2={b.y} stroke={left.colour} strokeWidth={left.strokePx} />
      <line x1={symbolX + SYMBOL_WIDTH} y1={b.y} x2={b.x2} y2={b.y} stroke={right.colour} strokeWidth={right.strokePx} />
      <g transform={`translate(${symbolX} ${symbolY})`}>
        {b.kind === "transformer" ? (
          <TransformerSymbol
            width={SYMBOL_WIDTH}
            height={SYMBOL_HEIGHT}
            hvSide={b.hvOnLeft ? "left" : "right"}
            hvStroke={hvStroke}
            lvStroke={lvStroke}
            tapChanger={b.tapChanger}
          />
        ) : (
          <LineSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} stroke={left} cable={b.kind === "cable"} />
        )}
      </g>
      <BranchLabel x={mid} y={b.y} nameLines={b.nameLines} details={b.details} />
    </g>
  );
}

/** A branch that closes a loop: down from one bus, along under the drawing with its symbol, up to the other. */
function Loop({ loop }: { loop: LoopBranch }) {
  const from = stroke(loop.fromKV);
  const to = stroke(loop.toKV);
  const [leftX, rightX] = [Math.min(loop.fromX, loop.toX), Math.max(loop.fromX, loop.toX)];
  const fromIsLeft = loop.fromX <= loop.toX;
  const mid = (leftX + rightX) / 2;
  const roomForSymbol = rightX - leftX >= SYMBOL_WIDTH + 24;
  const symbolX = mid - SYMBOL_WIDTH / 2;
  const leftStroke = fromIsLeft ? from : to;
  const rightStroke = fromIsLeft ? to : from;
  const [leftY, rightY] = fromIsLeft ? [loop.fromY, loop.toY] : [loop.toY, loop.fromY];
  return (
    <g>
      <polyline
        points={`${leftX},${leftY} ${leftX},${loop.y} ${roomForSymbol ? symbolX : mid},${loop.y}`}
        fill="none"
        stroke={leftStroke.colour}
        strokeWidth={leftStroke.strokePx}
      />
      <polyline
        points={`${roomForSymbol ? symbolX + SYMBOL_WIDTH : mid},${loop.y} ${rightX},${loop.y} ${rightX},${rightY}`}
        fill="none"
        stroke={rightStroke.colour}
        strokeWidth={rightStroke.strokePx}
      />
      {roomForSymbol ? (
        <g transform={`translate(${symbolX} ${loop.y - SYMBOL_HEIGHT / 2})`}>
          {loop.kind === "transformer" ? (
            <TransformerSymbol
              width={SYMBOL_WIDTH}
              height={SYMBOL_HEIGHT}
              hvSide={fromIsLeft ? "left" : "right"}
              hvStroke={from}
              lvStroke={to}
              tapChanger={loop.tapChanger}
            />
          ) : (
            <LineSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} stroke={leftStroke} cable={loop.kind === "cable"} />
          )}
        </g>
      ) : null}
      <BranchLabel x={mid} y={loop.y} nameLines={loop.nameLines} details={loop.details} />
    </g>
  );
}

function BranchLabel({ x, y, nameLines, details }: { x: number; y: number; nameLines: string[]; details: string[] }) {
  return (
    <text x={x} y={y + 36} textAnchor="middle" className="ks-sld-detail">
      <LabelLines x={x} nameLines={nameLines} details={details} />
    </text>
  );
}

/** Name lines in the name's weight, then detail lines, one under the other. */
function LabelLines({ x, nameLines, details }: { x: number; nameLines: string[]; details: string[] }) {
  return (
    <>
      {nameLines.map((line, i) => (
        <tspan key={`n${i}`} x={x} dy={i === 0 ? 0 : 14} className="ks-sld-name">
          {line}
        </tspan>
      ))}
      {details.map((line, i) => (
        <tspan key={`d${i}`} x={x} dy={13}>
          {line}
        </tspan>
      ))}
    </>
  );
}

function Attachment({ attachment: a }: { attachment: PlacedAttachment }) {
  const s = stroke(a.nominalKV);
  const stub = 22;
  if (a.side === "left") {
    const symbolX = a.x - stub - SYMBOL_WIDTH;
    return (
      <g>
        <line x1={a.x - stub} y1={a.y} x2={a.x} y2={a.y} stroke={s.colour} strokeWidth={s.strokePx} />
        <g transform={`translate(${symbolX} ${a.y - SYMBOL_HEIGHT / 2})`}>
          {a.kind === "grid" ? (
            <GridInfeedSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="right" stroke={s} />
          ) : (
            <GeneratorSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="right" stroke={s} />
          )}
        </g>
        <text x={a.x - 10} y={a.y + 36} textAnchor="end" className="ks-sld-detail">
          <LabelLines x={a.x - 10} nameLines={a.nameLines} details={a.details} />
        </text>
      </g>
    );
  }
  const symbolX = a.x + stub;
  const textX = a.x + ATTACHMENT_TEXT_OFFSET;
  return (
    <g>
      <line x1={a.x} y1={a.y} x2={symbolX} y2={a.y} stroke={s.colour} strokeWidth={s.strokePx} />
      <g transform={`translate(${symbolX} ${a.y - SYMBOL_HEIGHT / 2})`}>
        <AttachmentSymbol kind={a.kind} stroke={s} />
      </g>
      <text x={textX} y={a.y - 3} className="ks-sld-detail">
        <LabelLines x={textX} nameLines={a.nameLines} details={a.details} />
      </text>
    </g>
  );
}

function AttachmentSymbol({ kind, stroke: s }: { kind: PlacedAttachment["kind"]; stroke: SymbolStroke }) {
  switch (kind) {
    case "load":
      return <LoadSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="left" stroke={s} />;
    case "capacitor":
      return <CapacitorSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="left" stroke={s} />;
    case "reactor":
      return <ReactorSymbol stroke={s} />;
    case "grid":
      return <GridInfeedSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="left" stroke={s} />;
    case "generator":
      return <GeneratorSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="left" stroke={s} />;
    case "converter":
      return <ConverterSymbol width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} side="left" stroke={s} />;
  }
}

/** A shunt reactor (a shunt with negative Mvar): a winding of three turns to earth. The sheet has no symbol for it. */
function ReactorSymbol({ stroke: s }: { stroke: SymbolStroke }) {
  const cy = SYMBOL_HEIGHT / 2;
  return (
    <svg width={SYMBOL_WIDTH} height={SYMBOL_HEIGHT} viewBox={`0 0 ${SYMBOL_WIDTH} ${SYMBOL_HEIGHT}`} aria-hidden="true" focusable="false">
      <path
        d={`M 0 ${cy} L 12 ${cy} a 5 5 0 0 1 10 0 a 5 5 0 0 1 10 0 a 5 5 0 0 1 10 0 L 48 ${cy}`}
        fill="none"
        stroke={s.colour}
        strokeWidth={Math.max(1.5, s.strokePx * 0.8)}
      />
      <g stroke="var(--color-ink-soft, #3f4b59)" strokeWidth={1.5}>
        <line x1={48} y1={cy - 9} x2={48} y2={cy + 9} />
        <line x1={52} y1={cy - 6} x2={52} y2={cy + 6} />
      </g>
    </svg>
  );
}
