// The study report's tables of the solved network: buses, branches, fault levels and checks,
// every quantity with its unit and every status with an icon and words.
import { statusCue, upperLimitStatus, voltageStatus, type LimitStatus } from "#app/components/sheet/readingStatus.ts";
import { checkLine, fixed, kvText } from "#app/components/ladder/ladderText.ts";
import { DataTable, type DataTableProps } from "#app/components/DataTable.tsx";
import type { BranchReading, SolveResult } from "#solver/results.ts";
import type { Bus, Network } from "#solver/schema.ts";

function Status({ status }: { status: LimitStatus | undefined }) {
  if (!status) return <span className="ks-muted">no limit given</span>;
  const cue = statusCue[status];
  return (
    <span className={`ks-status ks-status-${status}`}>
      <span aria-hidden="true">{cue.icon}</span> {cue.words}
    </span>
  );
}

const nameOf = (network: Network, id: string) => network.buses.find((b) => b.id === id)?.name ?? id;

const REPORT_TABLE = "data-table ks-report-table";

export function BusTable({ network, result }: { network: Network; result: SolveResult }) {
  const readings = new Map(result.loadFlow.buses.map((b) => [b.id, b]));
  const columns: DataTableProps<Bus>["columns"] = [
    { header: "Bus", cell: (bus) => bus.name },
    { header: <>U<sub>n</sub></>, unit: "kV", numeric: true, cell: (bus) => fixed(bus.nominalKV, 2) },
    { header: "V", unit: "pu", numeric: true, cell: (bus) => fixed(readings.get(bus.id)?.vPu, 4) },
    { header: "V", unit: "kV", numeric: true, cell: (bus) => fixed(readings.get(bus.id)?.vKV, 2) },
    { header: "Angle", unit: "°", numeric: true, cell: (bus) => fixed(readings.get(bus.id)?.angleDeg, 2) },
    { header: "Band", unit: "pu", numeric: true, cell: (bus) => `${fixed(bus.vMinPu, 2)}–${fixed(bus.vMaxPu, 2)}` },
    {
      header: "Status",
      cell: (bus) => {
        const r = readings.get(bus.id);
        return r ? <Status status={voltageStatus(r.vPu, bus.vMinPu, bus.vMaxPu)} /> : "–";
      },
    },
  ];
  return <DataTable className={REPORT_TABLE} caption="Bus voltages" columns={columns} rows={network.buses} rowKey={(bus) => bus.id} />;
}

export function BranchTable({ network, result }: { network: Network; result: SolveResult }) {
  const names = new Map([...network.lines, ...network.transformers].map((e) => [e.id, e.name]));
  const kinds = new Map<string, string>([
    ...network.lines.map((l): [string, string] => [l.id, l.kind === "cable" ? "cable" : "overhead line"]),
    ...network.transformers.map((t): [string, string] => [t.id, "transformer"]),
  ]);
  const columns: DataTableProps<BranchReading>["columns"] = [
    {
      header: "Branch",
      cell: (b) => (
        <>
          {names.get(b.id) ?? b.id}
          <span className="ks-cell-note">{kinds.get(b.id)}</span>
        </>
      ),
    },
    { header: "From → to", cell: (b) => `${nameOf(network, b.fromBus)} → ${nameOf(network, b.toBus)}` },
    { header: "P", unit: "MW", numeric: true, cell: (b) => fixed(b.pFromMW, 3) },
    { header: "Q", unit: "Mvar", numeric: true, cell: (b) => fixed(b.qFromMvar, 3) },
    { header: "I", unit: "A", numeric: true, cell: (b) => fixed(b.currentA, 1) },
    { header: "Loading", unit: "%", numeric: true, cell: (b) => fixed(b.loadingPct, 1) },
    { header: "Losses", unit: "kW", numeric: true, cell: (b) => fixed(b.lossKW, 1) },
    { header: "Status", cell: (b) => <Status status={upperLimitStatus(b.loadingPct, b.loadingPct === null ? undefined : 100)} /> },
  ];
  return (
    <DataTable
      className={REPORT_TABLE}
      caption="Branch flows and losses (flows at the first-named end)"
      columns={columns}
      rows={result.loadFlow.branches}
      rowKey={(b) => b.id}
      foot={
        <tr>
          <th scope="row" colSpan={6}>
            Losses in all (generation {fixed(result.loadFlow.totals.generationMW, 3)} MW, load {fixed(result.loadFlow.totals.loadMW, 3)} MW)
          </th>
          <td className="num">{fixed(result.loadFlow.totals.lossMW * 1000, 1)}</td>
          <td>{fixed(result.loadFlow.totals.lossPct, 2)} % of generation</td>
        </tr>
      }
    />
  );
}

export function FaultTable({ network, result }: { network: Network; result: SolveResult }) {
  const faults = new Map((result.faults?.buses ?? []).map((f) => [f.id, f]));
  const fault = (bus: Bus) => faults.get(bus.id);
  const columns: DataTableProps<Bus>["columns"] = [
    {
      header: "Bus",
      cell: (bus) => (
        <>
          {bus.name}
          <span className="ks-cell-note">{kvText(bus.nominalKV)}</span>
        </>
      ),
    },
    { header: "I″k3", unit: "kA", numeric: true, cell: (bus) => fixed(fault(bus)?.ik3kA, 2) },
    { header: "S″k3", unit: "MVA", numeric: true, cell: (bus) => fixed(fault(bus)?.ik3MVA, 0) },
    { header: <>i<sub>p</sub></>, unit: "kA", numeric: true, cell: (bus) => fixed(fault(bus)?.ip3kA, 2) },
    {
      header: "I″k1",
      unit: "kA",
      numeric: true,
      cell: (bus) => {
        const f = fault(bus);
        return (
          <>
            {fixed(f?.ik1kA, 2)}
            {f?.note ? <span className="ks-cell-note">{f.note}</span> : null}
          </>
        );
      },
    },
    { header: "R/X", numeric: true, cell: (bus) => fixed(fault(bus)?.rOverX, 3) },
    { header: "Breaking", unit: "kA", numeric: true, cell: (bus) => fixed(bus.breakingKA, 1) },
    {
      header: "Status",
      cell: (bus) => {
        const f = fault(bus);
        return f ? <Status status={upperLimitStatus(Math.max(f.ik3kA, f.ik1kA), bus.breakingKA)} /> : "–";
      },
    },
  ];
  return (
    <DataTable
      className={REPORT_TABLE}
      caption={
        <>
          Initial short-circuit currents by IEC 60909-0 (maximum: c<sub>max</sub> 1.10 above 1 kV, 1.05 at or below)
        </>
      }
      columns={columns}
      rows={network.buses}
      rowKey={(bus) => bus.id}
    />
  );
}

export function CheckList({ network, result }: { network: Network; result: SolveResult }) {
  if (result.checks.length === 0)
    return (
      <p className="ks-status ks-status-within">
        <span aria-hidden="true">{statusCue.within.icon}</span> Every voltage, loading and breaking current is within its limit.
      </p>
    );
  return (
    <ul className="ks-report-checks">
      {result.checks.map((c, i) => (
        <li key={`${c.element}-${c.kind}-${i}`}>
          <span className="ks-status ks-status-beyond">
            <span aria-hidden="true">{statusCue.beyond.icon}</span> {checkLine(c, network)}
          </span>
          <span className="ks-check-rule">{c.message}</span>
        </li>
      ))}
    </ul>
  );
}
