// The sheet's node components, one per element kind. Each draws its symbol at a fixed size (the
// size flowModel gives xyflow), its name above and its Readings below.
import { memo, type CSSProperties, type ReactNode } from "react";
import { Handle, Position, useConnection, type NodeProps } from "@xyflow/react";
import type { Bus, Line, Load, Shunt, Source, Transformer } from "#solver/schema.ts";
import type { SheetNode, Side, TerminalId } from "./flowModel.ts";
import { flowArrow } from "./readingFormat.ts";
import { readingAgainstLimit, readingNumber } from "#app/lib/format.ts";
import { UNEARTHED_NOTE } from "#solver/faults/index.ts";
import { type LimitStatus, lowerLimitStatus, statusCue, upperLimitStatus, voltageStatus } from "#app/lib/limitStatus.ts";
import { minShortCircuitRatio } from "#solver/equipmentRules.ts";
import { useSheet } from "./sheetStore.ts";
import { nameRoomPx, nameSubLine } from "./labelBoxes.ts";
import {
  CapacitorSymbol,
  ConverterSymbol,
  GeneratorSymbol,
  GridInfeedSymbol,
  LineSymbol,
  LoadSymbol,
  TransformerSymbol,
  type SymbolStroke,
} from "./symbols.tsx";
import { strokeFor, unconnectedStyle } from "./voltageClasses.ts";

function strokeOf(kv: number | undefined): SymbolStroke {
  if (kv === undefined) return { ...unconnectedStyle, dashed: true };
  return strokeFor(kv);
}

export function StatusMark({ status }: { status: LimitStatus | undefined }) {
  if (!status) return null;
  const cue = statusCue[status];
  return (
    <span className={`ks-status ${cue.className}`} title={cue.words}>
      <span aria-hidden="true">{cue.icon}</span>
      <span className="sr-only"> {cue.words}</span>
    </span>
  );
}

function Terminal({ id, side, readOnly }: { id: TerminalId; side: Side; readOnly: boolean }) {
  return (
    <Handle
      type="source"
      id={id}
      position={side === "left" ? Position.Left : Position.Right}
      isConnectable={!readOnly}
      className="ks-terminal"
      title={readOnly ? undefined : `${id === "t" ? "Terminal" : `${id.toUpperCase()} terminal`}: drag to a busbar to connect`}
    />
  );
}

/** A name's room (see nameRoomPx) as a style: zoomed out, sheet.css cuts the larger name to it. */
const labelRoom = (name: string) => ({ "--ks-label-room": `${nameRoomPx(name)}px` }) as CSSProperties;

function Label({ name, children }: { name: string; children: ReactNode }) {
  return (
    <div className="ks-node-label" style={labelRoom(name)}>
      {name}
      {children}
    </div>
  );
}

function ReadingBlock({ children }: { children: ReactNode }) {
  const show = useSheet((s) => s.showReadings);
  if (!show) return null;
  return <div className="ks-readings">{children}</div>;
}

const useReadOnly = () => useSheet((s) => s.readOnly);

/**
 * A draft's element outside the solved part, or one out of service (or without supply) in the
 * operating case shown: drawn faint, with the reason in words.
 */
function useLeftOut(id: string): boolean {
  return useSheet((s) => s.solve.kind === "solved" && (s.solve.readings.leftOut.has(id) || s.solve.readings.shownCase?.outOfService.has(id) === true));
}

function LeftOutMark({ id }: { id: string }) {
  const outInCase = useSheet((s) => s.solve.kind === "solved" && s.solve.readings.shownCase?.outOfService.has(id) === true);
  return <span className="ks-left-out-mark">{outInCase ? "out in this case" : "not solved: see Checks"}</span>;
}

/** In the envelope: the bus's lowest and highest voltage over the cases, each with its case. */
function EnvelopeBusReadings({ id, bus }: { id: string; bus: Bus }) {
  const row = useSheet((s) => (s.solve.kind === "envelope" ? s.solve.envelope.buses.get(id) : undefined));
  if (!row) return null;
  const band: [number, number] = [bus.vMinPu, bus.vMaxPu];
  const low = voltageStatus(row.vMinPu, bus.vMinPu, bus.vMaxPu);
  const high = voltageStatus(row.vMaxPu, bus.vMinPu, bus.vMaxPu);
  return (
    <ReadingBlock>
      <div className={`ks-readings-envelope ${low ? statusCue[low].className : ""}`}>
        lowest {readingAgainstLimit(row.vMinPu, band, "pu")} pu · {row.vMinCase.name} <StatusMark status={low} />
      </div>
      <div className={`ks-readings-envelope ${high ? statusCue[high].className : ""}`}>
        highest {readingAgainstLimit(row.vMaxPu, band, "pu")} pu · {row.vMaxCase.name} <StatusMark status={high} />
      </div>
    </ReadingBlock>
  );
}

function BusNodeView({ id, data }: NodeProps<SheetNode>) {
  const leftOut = useLeftOut(id);
  const bus = data.element as Bus;
  const connecting = useConnection((c) => c.inProgress);
  const reading = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.buses.get(id) : undefined));
  const fault = useSheet((s) => (s.solve.kind === "solved" && s.showFaults ? s.solve.readings.faults.get(id) : undefined));
  const stroke = strokeFor(bus.nominalKV);
  const bar = data.bar ?? { top: -data.height / 2, bottom: data.height / 2 };
  const barTopPx = data.height / 2 + bar.top;
  const barLengthPx = bar.bottom - bar.top;
  const vStatus = reading ? voltageStatus(reading.vPu, bus.vMinPu, bus.vMaxPu) : undefined;
  const faultStatus = fault ? upperLimitStatus(Math.max(fault.ik3kA, fault.ik1kA), bus.breakingKA, "kA") : undefined;
  const unearthed = fault?.note === UNEARTHED_NOTE;
  const sk3MinMVA = fault ? Math.sqrt(3) * bus.nominalKV * fault.ik3MinKA : undefined;
  const minimumStatus = lowerLimitStatus(sk3MinMVA, bus.minFaultMVA, "MVA");
  return (
    <div className={`ks-node ks-bus${leftOut ? " ks-left-out" : ""}`} style={{ width: data.width, height: data.height }}>
      {leftOut ? <LeftOutMark id={id} /> : null}
      <div className="ks-bus-span" style={{ top: barTopPx, height: barLengthPx }}>
        <div className="ks-node-label ks-bus-label" style={labelRoom(bus.name)}>
          <span className="ks-bus-name">{bus.name}</span>
          <span className="ks-bus-kv">{nameSubLine("bus", bus)}</span>
        </div>
        <div className="ks-bar" style={{ background: stroke.colour, width: Math.max(5, stroke.strokePx + 3) }} aria-hidden="true" />
        <Handle
          type="target"
          id="bar"
          position={Position.Left}
          isConnectableStart={false}
          className={`ks-bar-handle${connecting ? " ks-bar-handle-live" : ""}`}
        />
        {reading || fault ? (
          <ReadingBlock>
            {reading ? (
              <>
                <div className={vStatus ? statusCue[vStatus].className : undefined}>
                  {readingNumber(reading.vKV, "kV")} kV <StatusMark status={vStatus} />
                </div>
                <div>
                  {readingAgainstLimit(reading.vPu, [bus.vMinPu, bus.vMaxPu], "pu")} pu ∠ {readingNumber(reading.angleDeg, "deg")}°
                </div>
              </>
            ) : null}
            {fault ? (
              <div className={`ks-fault ${faultStatus ? statusCue[faultStatus].className : ""}`}>
                I″k3 {readingAgainstLimit(fault.ik3kA, [bus.breakingKA], "kA")} kA · I″k1 {unearthed ? "unearthed" : `${readingAgainstLimit(fault.ik1kA, [bus.breakingKA], "kA")} kA`}{" "}
                <StatusMark status={faultStatus} />
              </div>
            ) : null}
            {fault && sk3MinMVA !== undefined ? (
              <div className={`ks-fault ${minimumStatus ? statusCue[minimumStatus].className : ""}`}>
                S″k3 min {readingAgainstLimit(sk3MinMVA, [bus.minFaultMVA], "MVA")} MVA{bus.minFaultMVA !== undefined ? ` (asked ${readingNumber(bus.minFaultMVA, "MVA")})` : ""}{" "}
                <StatusMark status={minimumStatus} />
              </div>
            ) : null}
          </ReadingBlock>
        ) : null}
        <EnvelopeBusReadings id={id} bus={bus} />
      </div>
    </div>
  );
}

function BranchReadings({
  id,
  fromSide,
  reversed,
  ratedLoading,
  children,
}: {
  id: string;
  fromSide: Side;
  reversed: boolean;
  ratedLoading: boolean;
  /** Further lines in the same block (a regulating tap), so they stack instead of overlapping. */
  children?: ReactNode;
}) {
  const reading = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.branches.get(id) : undefined));
  const envelope = useSheet((s) => (s.solve.kind === "envelope" ? s.solve.envelope.branches.get(id) : undefined));
  if (envelope) {
    const highest = upperLimitStatus(envelope.maxLoadingPct, 100, "pct");
    return (
      <ReadingBlock>
        <div className={`ks-readings-envelope ${highest ? statusCue[highest].className : ""}`}>
          highest {readingAgainstLimit(envelope.maxLoadingPct, [100], "pct")} % · {envelope.maxLoadingCase.name} <StatusMark status={highest} />
        </div>
      </ReadingBlock>
    );
  }
  if (!reading) return null;
  // The reading's from-end may be the element's other terminal (a transformer reads HV to LV).
  const side: Side = reversed ? (fromSide === "left" ? "right" : "left") : fromSide;
  const loading = ratedLoading ? upperLimitStatus(reading.loadingPct, 100, "pct") : undefined;
  return (
    <ReadingBlock>
      <div>
        <span aria-label={`active power ${reading.pFromMW >= 0 ? "forward" : "reverse"}`}>{flowArrow(reading.pFromMW, side)}</span>{" "}
        {readingNumber(Math.abs(reading.pFromMW), "MW")} MW{" "}
        <span aria-label={`reactive power ${reading.qFromMvar >= 0 ? "forward" : "reverse"}`}>{flowArrow(reading.qFromMvar, side)}</span>{" "}
        {readingNumber(Math.abs(reading.qFromMvar), "Mvar")} Mvar
      </div>
      <div className={loading ? statusCue[loading].className : undefined}>
        loss {readingNumber(reading.lossKW, "kW")} kW
        {reading.loadingPct !== null ? (
          <>
            {" "}
            · {readingAgainstLimit(reading.loadingPct, [100], "pct")} % <StatusMark status={loading} />
          </>
        ) : null}
      </div>
      {children}
    </ReadingBlock>
  );
}

function TransformerNodeView({ id, data }: NodeProps<SheetNode>) {
  const leftOut = useLeftOut(id);
  const t = data.element as Transformer;
  const readOnly = useReadOnly();
  const hvSide = data.sides.hv ?? "left";
  const branch = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.branches.get(id) : undefined));
  return (
    <div className={`ks-node ks-part${leftOut ? " ks-left-out" : ""}`} style={{ width: data.width, height: data.height }}>
      {leftOut ? <LeftOutMark id={id} /> : null}
      <Label name={t.name}>
        <span className="ks-node-sub">{nameSubLine("transformer", t)}</span>
      </Label>
      <TransformerSymbol
        width={data.width}
        height={data.height}
        hvSide={hvSide}
        hvStroke={strokeOf(data.terminalKV.hv)}
        lvStroke={strokeOf(data.terminalKV.lv)}
        tapChanger={t.tapMinPct !== undefined || t.tapMaxPct !== undefined}
      />
      <Terminal id="hv" side={hvSide} readOnly={readOnly} />
      <Terminal id="lv" side={data.sides.lv ?? "right"} readOnly={readOnly} />
      <BranchReadings id={id} fromSide={hvSide} reversed={branch ? branch.fromBus !== t.hvBus : false} ratedLoading>
        {t.tapControl && branch?.tapPct !== undefined ? (
          <div className={branch.tapLimited ? statusCue.beyond.className : undefined}>
            regulating: tap {branch.tapPct > 0 ? "+" : ""}
            {readingNumber(branch.tapPct, "pct")} %{branch.tapLimited ? " · range ran out" : ""} <StatusMark status={branch.tapLimited ? "beyond" : undefined} />
          </div>
        ) : null}
      </BranchReadings>
    </div>
  );
}

function LineNodeView({ id, data }: NodeProps<SheetNode>) {
  const leftOut = useLeftOut(id);
  const line = data.element as Line;
  const readOnly = useReadOnly();
  const fromSide = data.sides.from ?? "left";
  const kv = data.terminalKV.from ?? data.terminalKV.to;
  const branch = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.branches.get(id) : undefined));
  return (
    <div className={`ks-node ks-part${leftOut ? " ks-left-out" : ""}`} style={{ width: data.width, height: data.height }}>
      {leftOut ? <LeftOutMark id={id} /> : null}
      <Label name={line.name}>
        <span className="ks-node-sub">{nameSubLine("line", line)}</span>
      </Label>
      <LineSymbol width={data.width} height={data.height} stroke={strokeOf(kv)} cable={line.kind === "cable"} />
      <Terminal id="from" side={fromSide} readOnly={readOnly} />
      <Terminal id="to" side={data.sides.to ?? "right"} readOnly={readOnly} />
      <BranchReadings
        id={id}
        fromSide={fromSide}
        reversed={branch ? branch.fromBus !== line.fromBus : false}
        ratedLoading={line.ampacityA !== undefined}
      />
    </div>
  );
}

function SourceNodeView({ id, data }: NodeProps<SheetNode>) {
  const leftOut = useLeftOut(id);
  const source = data.element as Source;
  const readOnly = useReadOnly();
  const side = data.sides.t ?? "right";
  const reading = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.sources.get(id) : undefined));
  const scr = useSheet((s) => (s.solve.kind === "solved" && s.showFaults ? s.solve.readings.result.faults?.converters.find((c) => c.id === id)?.scr : undefined));
  const Symbol = source.kind === "grid" ? GridInfeedSymbol : source.kind === "converter" ? ConverterSymbol : GeneratorSymbol;
  return (
    <div className={`ks-node ks-part${leftOut ? " ks-left-out" : ""}`} style={{ width: data.width, height: data.height }}>
      {leftOut ? <LeftOutMark id={id} /> : null}
      <Label name={source.name}>
        <span className="ks-node-sub">{nameSubLine("source", source)}</span>
      </Label>
      <Symbol width={data.width} height={data.height} side={side} stroke={strokeOf(data.terminalKV.t)} />
      <Terminal id="t" side={side} readOnly={readOnly} />
      {reading ? (
        <ReadingBlock>
          <div>
            {readingNumber(reading.pMW, "MW")} MW · {readingNumber(reading.qMvar, "Mvar")} Mvar
          </div>
          {scr !== undefined ? (
            <div className={scr < minShortCircuitRatio(source) ? statusCue.beyond.className : undefined}>
              SCR {readingAgainstLimit(scr, [minShortCircuitRatio(source)], "ratio")} <StatusMark status={scr < minShortCircuitRatio(source) ? "beyond" : undefined} />
            </div>
          ) : null}
        </ReadingBlock>
      ) : null}
    </div>
  );
}

function LoadNodeView({ id, data }: NodeProps<SheetNode>) {
  const leftOut = useLeftOut(id);
  const load = data.element as Load;
  const readOnly = useReadOnly();
  const side = data.sides.t ?? "left";
  return (
    <div className={`ks-node ks-part${leftOut ? " ks-left-out" : ""}`} style={{ width: data.width, height: data.height }}>
      {leftOut ? <LeftOutMark id={id} /> : null}
      <Label name={load.name}>
        <span className="ks-node-sub">{nameSubLine("load", load)}</span>
      </Label>
      <LoadSymbol width={data.width} height={data.height} side={side} stroke={strokeOf(data.terminalKV.t)} />
      <Terminal id="t" side={side} readOnly={readOnly} />
    </div>
  );
}

function ShuntNodeView({ id, data }: NodeProps<SheetNode>) {
  const leftOut = useLeftOut(id);
  const shunt = data.element as Shunt;
  const readOnly = useReadOnly();
  const side = data.sides.t ?? "left";
  return (
    <div className={`ks-node ks-part${leftOut ? " ks-left-out" : ""}`} style={{ width: data.width, height: data.height }}>
      {leftOut ? <LeftOutMark id={id} /> : null}
      <Label name={shunt.name}>
        <span className="ks-node-sub">{nameSubLine("shunt", shunt)}</span>
      </Label>
      <CapacitorSymbol width={data.width} height={data.height} side={side} stroke={strokeOf(data.terminalKV.t)} />
      <Terminal id="t" side={side} readOnly={readOnly} />
    </div>
  );
}

/** Module level, so xyflow never sees a new object and never remounts the nodes. */
export const nodeTypes = {
  bus: memo(BusNodeView),
  transformer: memo(TransformerNodeView),
  line: memo(LineNodeView),
  source: memo(SourceNodeView),
  load: memo(LoadNodeView),
  shunt: memo(ShuntNodeView),
};
