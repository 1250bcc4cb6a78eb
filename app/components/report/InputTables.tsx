// The study report's input data: every element of the network file by kind, each quantity with
// its unit, so a reviewer can check what was solved without opening the file. A dash is a value
// the file does not give. Seldom-given data (a source's ratings and limits, a line's zero sequence)
// is written out in a last column, only where the file has it.
import { DataTable, type DataTableProps } from "#app/components/DataTable.tsx";
import { voltageClassOf } from "#app/components/sheet/voltageClasses.ts";
import { formatNumber } from "#app/lib/format.ts";
import type { Bus, Line, Load, Network, Shunt, Source, Transformer } from "#solver/schema.ts";
import { REPORT_TABLE, TableScroll } from "./TableScroll.tsx";


/** The voltage class as the drawings show it: a stroke of its weight and hue, and its range in words. */
function VoltageClassTag({ nominalKV }: { nominalKV: number }) {
  const voltageClass = voltageClassOf(nominalKV);
  if (!voltageClass) return "–";
  return (
    <span className="ks-class-tag">
      <svg width="20" height="8" aria-hidden="true" focusable="false">
        <line x1="1" y1="4" x2="19" y2="4" style={{ stroke: voltageClass.colour, strokeWidth: voltageClass.strokePx }} />
      </svg>
      {voltageClass.label}
    </span>
  );
}

function Named({ name, note }: { name: string; note: string }) {
  return (
    <>
      {name}
      <span className="ks-cell-note">{note}</span>
    </>
  );
}

/** "a; b" of the parts that are given, or a dash. */
function further(parts: (string | false | undefined)[]): string {
  const given = parts.filter((p): p is string => typeof p === "string");
  return given.length ? given.join("; ") : "–";
}

const num = (value: number | null | undefined, digits?: number) => formatNumber(value, digits);
/** Taps with their sign, a true minus as the ladder writes them. */
const signed = (value: number) => (value > 0 ? `+${num(value)}` : value < 0 ? `−${num(-value)}` : "0");

function sourceControl(s: Source): string {
  const kind = s.kind === "grid" ? "Grid infeed" : "Generator";
  const control = s.control === "slack" ? "slack" : s.control === "pv" ? "P and V set" : "P and Q set";
  return `${kind}, ${control}`;
}

function Tap({ t }: { t: Transformer }) {
  const range = t.tapMinPct !== undefined && t.tapMaxPct !== undefined ? `${signed(t.tapMinPct)} to ${signed(t.tapMaxPct)}${t.tapStepPct !== undefined ? ` by ${num(t.tapStepPct)}` : ""}` : null;
  return (
    <>
      {signed(t.tapPct)}
      {range ? <span className="ks-cell-note">{range}</span> : null}
    </>
  );
}

function powerFactorText(load: Load): string {
  const apparentMVA = Math.hypot(load.pMW, load.qMvar);
  if (apparentMVA === 0) return "–";
  const powerFactor = num(Math.abs(load.pMW) / apparentMVA, 3);
  return load.qMvar === 0 ? powerFactor : `${powerFactor} ${load.qMvar > 0 ? "lagging" : "leading"}`;
}

function InputTable<Row extends { id: string }>({ caption, columns, rows }: { caption: string; columns: DataTableProps<Row>["columns"]; rows: readonly Row[] }) {
  if (rows.length === 0) return null;
  return (
    <TableScroll label={caption}>
      <DataTable className={REPORT_TABLE} caption={caption} columns={columns} rows={rows} rowKey={(row) => row.id} />
    </TableScroll>
  );
}

export function InputTables({ network }: { network: Network }) {
  const busName = new Map(network.buses.map((b) => [b.id, b.name]));
  const bus = (id: string) => busName.get(id) ?? id;

  const busColumns: DataTableProps<Bus>["columns"] = [
    { header: "Bus", cell: (b) => <Named name={b.name} note={b.id} /> },
    { header: "Voltage class", cell: (b) => <VoltageClassTag nominalKV={b.nominalKV} /> },
    { header: <>U<sub>n</sub></>, unit: "kV", numeric: true, cell: (b) => num(b.nominalKV) },
    { header: "Band", unit: "pu", numeric: true, cell: (b) => `${num(b.vMinPu)}–${num(b.vMaxPu)}` },
    { header: "Breaking", unit: "kA", numeric: true, cell: (b) => num(b.breakingKA) },
  ];
  const sourceColumns: DataTableProps<Source>["columns"] = [
    { header: "Source", cell: (s) => <Named name={s.name} note={bus(s.bus)} /> },
    { header: "Kind and control", cell: sourceControl },
    { header: "V set", unit: "pu", numeric: true, cell: (s) => (s.control === "pq" ? "–" : num(s.voltagePu)) },
    { header: "P", unit: "MW", numeric: true, cell: (s) => (s.control === "slack" ? "–" : num(s.pMW)) },
    { header: "Q", unit: "Mvar", numeric: true, cell: (s) => (s.control === "pq" ? num(s.qMvar) : "–") },
    { header: "S″k", unit: "MVA", numeric: true, cell: (s) => num(s.shortCircuitMVA) },
    { header: <>S<sub>r</sub></>, unit: "MVA", numeric: true, cell: (s) => num(s.ratedMVA) },
    { header: "X″d", unit: "%", numeric: true, cell: (s) => num(s.xdSubtransientPct) },
    { header: "X/R", numeric: true, cell: (s) => num(s.xOverR) },
    {
      header: "Further data",
      cell: (s) =>
        further([
          s.control === "slack" && s.angleDeg !== 0 && `angle ${num(s.angleDeg)}°`,
          (s.qMinMvar !== undefined || s.qMaxMvar !== undefined) && `Q limits ${num(s.qMinMvar)} to ${num(s.qMaxMvar)} Mvar`,
          s.ratedKV !== undefined && `rated ${num(s.ratedKV)} kV`,
          s.ratedPowerFactor !== undefined && `rated power factor ${num(s.ratedPowerFactor)}`,
          s.z0OverZ1 !== undefined && `Z0/Z1 ${num(s.z0OverZ1)}`,
        ]),
    },
  ];
  const transformerColumns: DataTableProps<Transformer>["columns"] = [
    { header: "Transformer", cell: (t) => <Named name={t.name} note={`${bus(t.hvBus)} → ${bus(t.lvBus)}`} /> },
    { header: <>S<sub>r</sub></>, unit: "MVA", numeric: true, cell: (t) => num(t.ratedMVA) },
    { header: "HV / LV", unit: "kV", numeric: true, cell: (t) => `${num(t.hvKV)} / ${num(t.lvKV)}` },
    { header: <>u<sub>k</sub></>, unit: "%", numeric: true, cell: (t) => num(t.impedancePct) },
    { header: "X/R", numeric: true, cell: (t) => num(t.xOverR) },
    { header: <>P<sub>k</sub></>, unit: "kW", numeric: true, cell: (t) => num(t.loadLossKW) },
    { header: <>P<sub>0</sub></>, unit: "kW", numeric: true, cell: (t) => num(t.noLoadLossKW) },
    { header: "Tap", unit: "%", numeric: true, cell: (t) => <Tap t={t} /> },
    { header: "Vector group", cell: (t) => t.vectorGroup },
    { header: "Z0/Z1", numeric: true, cell: (t) => num(t.z0OverZ1) },
  ];
  const lineColumns: DataTableProps<Line>["columns"] = [
    { header: "Line or cable", cell: (l) => <Named name={l.name} note={`${bus(l.fromBus)} → ${bus(l.toBus)}`} /> },
    { header: "Construction", cell: (l) => (l.kind === "cable" ? "Cable" : "Overhead line") },
    { header: "Length", unit: "km", numeric: true, cell: (l) => num(l.lengthKm) },
    { header: "R", unit: "Ω/km", numeric: true, cell: (l) => num(l.rOhmPerKm, 4) },
    { header: "X", unit: "Ω/km", numeric: true, cell: (l) => num(l.xOhmPerKm, 4) },
    { header: "B", unit: "µS/km", numeric: true, cell: (l) => num(l.bMicroSiemensPerKm) },
    { header: "Ampacity", unit: "A", numeric: true, cell: (l) => num(l.ampacityA) },
    {
      header: "Further data",
      cell: (l) =>
        further([
          (l.r0OhmPerKm !== undefined || l.x0OhmPerKm !== undefined) && `R0 ${num(l.r0OhmPerKm, 4)}, X0 ${num(l.x0OhmPerKm, 4)} Ω/km`,
        ]),
    },
  ];
  const loadColumns: DataTableProps<Load>["columns"] = [
    { header: "Load", cell: (ld) => <Named name={ld.name} note={bus(ld.bus)} /> },
    { header: "P", unit: "MW", numeric: true, cell: (ld) => num(ld.pMW) },
    { header: "Q", unit: "Mvar", numeric: true, cell: (ld) => num(ld.qMvar) },
    { header: "Power factor", numeric: true, cell: powerFactorText },
    { header: "Voltage dependence", cell: (ld) => ld.model.replace("constant-", "constant ") },
  ];
  const shuntColumns: DataTableProps<Shunt>["columns"] = [
    { header: "Shunt", cell: (sh) => <Named name={sh.name} note={bus(sh.bus)} /> },
    { header: "Q at 1 pu", unit: "Mvar", numeric: true, cell: (sh) => num(sh.qMvar) },
    { header: "Kind", cell: (sh) => (sh.qMvar >= 0 ? "Capacitor" : "Reactor") },
  ];

  const counts: [number, string][] = [
    [network.sources.length, "sources"],
    [network.transformers.length, "transformers"],
    [network.lines.length, "lines or cables"],
    [network.loads.length, "loads"],
    [network.shunts.length, "shunts"],
  ];
  const absent = counts.filter(([count]) => count === 0).map(([, kindWords]) => kindWords);
  return (
    <>
      <InputTable caption="Buses" columns={busColumns} rows={network.buses} />
      <InputTable caption="Sources" columns={sourceColumns} rows={network.sources} />
      <InputTable caption="Transformers" columns={transformerColumns} rows={network.transformers} />
      <InputTable caption="Lines and cables" columns={lineColumns} rows={network.lines} />
      <InputTable caption="Loads" columns={loadColumns} rows={network.loads} />
      <InputTable caption="Shunts" columns={shuntColumns} rows={network.shunts} />
      {absent.length ? <p>This network has no {absent.join(", no ")}.</p> : null}
    </>
  );
}
