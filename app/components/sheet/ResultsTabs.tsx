// Results under the sheet: buses, branches, sources, totals and fault levels as sortable tables,
// the voltage profile along the chain, CSV downloads, and the caution every results view carries.
import { lazy, Suspense, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from "@tanstack/react-table";
import type { Network } from "#solver/schema.ts";
import { fixed } from "./readingFormat.ts";
import { statusCue, upperLimitStatus, voltageStatus, type LimitStatus } from "./readingStatus.ts";
import { useSheet, type Readings } from "./sheetStore.ts";

const VoltageProfile = lazy(() => import("./VoltageProfile.tsx"));

export const RESULTS_CAUTION =
  "Results are for planning-stage screening. Verify them against the applicable grid code, local regulations and the equipment makers' data, and have protection settings and construction designs done and approved by licensed engineers. Fault levels by IEC 60909-0 are not a protection study.";

interface ColumnMeta {
  numeric?: boolean;
  unit?: string;
}

const severity: Record<LimitStatus, number> = { within: 0, near: 1, beyond: 2 };

function StatusCell({ status }: { status: LimitStatus | undefined }) {
  if (!status) return <span className="ks-muted">no limit</span>;
  const cue = statusCue[status];
  return (
    <span className={`ks-status-text ${cue.className}`}>
      <span aria-hidden="true">{cue.icon}</span> {cue.words}
    </span>
  );
}

function num<T>(key: keyof T & string, header: string, unit: string, digits: number): ColumnDef<T> {
  return {
    id: key,
    accessorFn: (row) => row[key] as number | null,
    header,
    meta: { numeric: true, unit } satisfies ColumnMeta,
    cell: (info) => fixed(info.getValue() as number | null, digits),
    sortUndefined: "last",
  };
}

function statusColumn<T extends { status: LimitStatus | undefined }>(): ColumnDef<T> {
  return {
    id: "status",
    accessorFn: (row) => (row.status ? severity[row.status] : -1),
    header: "Status",
    cell: (info) => <StatusCell status={info.row.original.status} />,
  };
}

function text<T>(key: keyof T & string, header: string): ColumnDef<T> {
  return { id: key, accessorFn: (row) => String(row[key] ?? ""), header };
}

function ResultsTable<T>({ caption, data, columns }: { caption: string; data: T[]; columns: ColumnDef<T>[] }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <div className="ks-table-wrap">
      <table className="data-table ks-results-table">
        <caption className="sr-only">{caption} (select a column heading to sort)</caption>
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const meta = header.column.columnDef.meta as ColumnMeta | undefined;
                const sorted = header.column.getIsSorted();
                return (
                  <th
                    key={header.id}
                    className={meta?.numeric ? "num" : undefined}
                    aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                    scope="col"
                  >
                    <button type="button" className="ks-sort" onClick={header.column.getToggleSortingHandler()}>
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      {meta?.unit ? <span className="unit"> {meta.unit}</span> : null}
                      <span aria-hidden="true" className="ks-sort-mark">
                        {sorted === "asc" ? " ↑" : sorted === "desc" ? " ↓" : " ↕"}
                      </span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id}>
              {row.getVisibleCells().map((cell) => {
                const meta = cell.column.columnDef.meta as ColumnMeta | undefined;
                return (
                  <td key={cell.id} className={meta?.numeric ? "num" : undefined}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

interface BusRow {
  name: string;
  nominalKV: number;
  vKV: number;
  vPu: number;
  angleDeg: number;
  band: string;
  status: LimitStatus | undefined;
}
interface BranchRow {
  name: string;
  kind: string;
  from: string;
  to: string;
  pFromMW: number;
  qFromMvar: number;
  pToMW: number;
  qToMvar: number;
  lossKW: number;
  currentA: number;
  loadingPct: number | null;
  status: LimitStatus | undefined;
}
interface SourceRow {
  name: string;
  bus: string;
  kind: string;
  control: string;
  pMW: number;
  qMvar: number;
}
interface FaultRow {
  name: string;
  nominalKV: number;
  ik3kA: number;
  ik3MVA: number;
  ip3kA: number;
  ik1kA: number;
  rOverX: number;
  breakingKA: number | null;
  status: LimitStatus | undefined;
  note: string;
}

const busColumns: ColumnDef<BusRow>[] = [
  text("name", "Bus"),
  num("nominalKV", "Nominal", "kV", 1),
  num("vKV", "Voltage", "kV", 3),
  num("vPu", "Voltage", "pu", 4),
  num("angleDeg", "Angle", "°", 2),
  text("band", "Band (pu)"),
  statusColumn(),
];
const branchColumns: ColumnDef<BranchRow>[] = [
  text("name", "Branch"),
  text("kind", "Kind"),
  text("from", "From"),
  text("to", "To"),
  num("pFromMW", "P from", "MW", 3),
  num("qFromMvar", "Q from", "Mvar", 3),
  num("pToMW", "P to", "MW", 3),
  num("qToMvar", "Q to", "Mvar", 3),
  num("lossKW", "Loss", "kW", 1),
  num("currentA", "Current", "A", 1),
  num("loadingPct", "Loading", "%", 1),
  statusColumn(),
];
const sourceColumns: ColumnDef<SourceRow>[] = [
  text("name", "Source"),
  text("bus", "Bus"),
  text("kind", "Kind"),
  text("control", "Control"),
  num("pMW", "P", "MW", 3),
  num("qMvar", "Q", "Mvar", 3),
];
const faultColumns: ColumnDef<FaultRow>[] = [
  text("name", "Bus"),
  num("nominalKV", "Nominal", "kV", 1),
  num("ik3kA", "I″k3", "kA", 3),
  num("ik3MVA", "S″k3", "MVA", 1),
  num("ip3kA", "ip", "kA", 3),
  num("ik1kA", "I″k1", "kA", 3),
  num("rOverX", "R/X", "", 3),
  num("breakingKA", "Breaking", "kA", 1),
  statusColumn(),
  text("note", "Note"),
];

function rowsFor(doc: Network, readings: Readings) {
  const busName = (id: string) => doc.buses.find((b) => b.id === id)?.name ?? id;
  const buses: BusRow[] = doc.buses.flatMap((bus) => {
    const r = readings.buses.get(bus.id);
    if (!r) return [];
    return [{ name: bus.name, nominalKV: bus.nominalKV, vKV: r.vKV, vPu: r.vPu, angleDeg: r.angleDeg, band: `${bus.vMinPu}–${bus.vMaxPu}`, status: voltageStatus(r.vPu, bus.vMinPu, bus.vMaxPu) }];
  });
  const branches: BranchRow[] = [...doc.transformers, ...doc.lines].flatMap((element) => {
    const r = readings.branches.get(element.id);
    if (!r) return [];
    const isLine = "lengthKm" in element;
    const rated = isLine ? element.ampacityA !== undefined : true;
    return [{
      name: element.name,
      kind: isLine ? (element.kind === "cable" ? "cable" : "overhead line") : "transformer",
      from: busName(r.fromBus),
      to: busName(r.toBus),
      pFromMW: r.pFromMW,
      qFromMvar: r.qFromMvar,
      pToMW: r.pToMW,
      qToMvar: r.qToMvar,
      lossKW: r.lossKW,
      currentA: r.currentA,
      loadingPct: r.loadingPct,
      status: rated ? upperLimitStatus(r.loadingPct, 100) : undefined,
    }];
  });
  const sources: SourceRow[] = doc.sources.flatMap((s) => {
    const r = readings.sources.get(s.id);
    if (!r) return [];
    return [{ name: s.name, bus: busName(s.bus), kind: s.kind === "grid" ? "grid infeed" : s.kind === "converter" ? "converter plant" : "generator", control: s.control, pMW: r.pMW, qMvar: r.qMvar }];
  });
  const faults: FaultRow[] = doc.buses.flatMap((bus) => {
    const f = readings.faults.get(bus.id);
    if (!f) return [];
    return [{
      name: bus.name,
      nominalKV: bus.nominalKV,
      ik3kA: f.ik3kA,
      ik3MVA: f.ik3MVA,
      ip3kA: f.ip3kA,
      ik1kA: f.ik1kA,
      rOverX: f.rOverX,
      breakingKA: bus.breakingKA ?? null,
      status: upperLimitStatus(Math.max(f.ik3kA, f.ik1kA), bus.breakingKA),
      note: f.note ?? "",
    }];
  });
  return { buses, branches, sources, faults };
}

type TabId = "buses" | "branches" | "sources" | "totals" | "faults" | "profile";
const tabs: { id: TabId; label: string }[] = [
  { id: "buses", label: "Buses" },
  { id: "branches", label: "Branches" },
  { id: "sources", label: "Sources" },
  { id: "totals", label: "Totals" },
  { id: "faults", label: "Faults" },
  { id: "profile", label: "Voltage profile" },
];

function CsvLink({ table, csvBase, revision }: { table: "buses" | "branches"; csvBase: string | null; revision: number }) {
  if (csvBase === null) return null;
  return (
    <a className="btn btn-small" href={`${csvBase}/results.csv?table=${table}`} download>
      Download CSV of {table} <span className="ks-muted">(saved revision {revision})</span>
    </a>
  );
}

/** `csvBase`: where the results CSV comes from (default the network's API); null hides the links. */
export function ResultsTabs({ csvBase }: { csvBase?: string | null }) {
  const solve = useSheet((s) => s.solve);
  const document = useSheet((s) => s.document);
  const networkId = useSheet((s) => s.networkId);
  const csvFrom = csvBase === undefined ? `/api/networks/${encodeURIComponent(networkId)}` : csvBase;
  const savedRevision = useSheet((s) => s.savedRevision);
  const [active, setActive] = useState<TabId>("buses");
  const tabRefs = useRef<Record<string, HTMLButtonElement | null>>({});
  const readings = solve.kind === "solved" ? solve.readings : undefined;
  const network = readings?.network;
  const rows = useMemo(() => (readings && network ? rowsFor(network, readings) : undefined), [readings, network]);
  const converged = readings?.result.loadFlow.converged ?? false;

  const onTabKey = (event: KeyboardEvent) => {
    const i = tabs.findIndex((t) => t.id === active);
    const next = event.key === "ArrowRight" ? i + 1 : event.key === "ArrowLeft" ? i - 1 : event.key === "Home" ? 0 : event.key === "End" ? tabs.length - 1 : null;
    if (next === null) return;
    event.preventDefault();
    const tab = tabs[(next + tabs.length) % tabs.length];
    setActive(tab.id);
    tabRefs.current[tab.id]?.focus();
  };

  let panel: ReactNode;
  if (!readings || !rows) {
    panel = (
      <p className="ks-panel-note">
        {solve.kind === "invalid"
          ? "No results: the drawing is not a complete network yet (see Checks)."
          : solve.kind === "failed"
            ? solve.message
            : "Solving…"}
      </p>
    );
  } else if (!converged && active !== "faults") {
    panel = (
      <p className="ks-check ks-check-issue" role="status">
        <span aria-hidden="true">✕ </span>No load-flow results: {readings.result.loadFlow.message ?? "the load flow did not converge."}
      </p>
    );
  } else if (active === "buses") {
    panel = (
      <>
        <ResultsTable caption="Bus voltages" data={rows.buses} columns={busColumns} />
        <div className="ks-results-foot">
          <CsvLink table="buses" csvBase={csvFrom} revision={savedRevision} />
          <p className="ks-muted">
            Angles are given as if every transformer were Yy0: vector-group phase shifts are not applied, which changes no
            magnitude or flow in a radial network.
          </p>
        </div>
      </>
    );
  } else if (active === "branches") {
    panel = (
      <>
        <ResultsTable caption="Branch flows" data={rows.branches} columns={branchColumns} />
        <div className="ks-results-foot">
          <CsvLink table="branches" csvBase={csvFrom} revision={savedRevision} />
          <p className="ks-muted">P and Q are measured into the branch at each end; loss is I²R for lines, copper plus core for transformers.</p>
        </div>
      </>
    );
  } else if (active === "sources") {
    panel = <ResultsTable caption="Source outputs" data={rows.sources} columns={sourceColumns} />;
  } else if (active === "totals") {
    const totals = readings.result.loadFlow.totals;
    panel = (
      <table className="data-table ks-totals">
        <caption className="sr-only">Totals</caption>
        <tbody>
          <tr><th scope="row">Generation</th><td className="num">{fixed(totals.generationMW, 3)} MW</td></tr>
          <tr><th scope="row">Load</th><td className="num">{fixed(totals.loadMW, 3)} MW</td></tr>
          <tr><th scope="row">Losses</th><td className="num">{fixed(totals.lossMW, 3)} MW ({fixed(totals.lossPct, 2)} % of generation)</td></tr>
          <tr><th scope="row">Load flow</th><td>{readings.result.loadFlow.method}, {readings.result.loadFlow.iterations} iterations, solved in {fixed(readings.elapsedMs, 1)} ms</td></tr>
        </tbody>
      </table>
    );
  } else if (active === "faults") {
    panel = rows.faults.length ? (
      <>
        <ResultsTable caption="Fault levels by IEC 60909-0" data={rows.faults} columns={faultColumns} />
        <p className="ks-muted ks-results-foot">
          IEC 60909-0 equivalent voltage source at each bus, c max; the status compares the larger of I″k3 and I″k1 with the
          switchgear breaking current.
        </p>
      </>
    ) : (
      <p className="ks-panel-note">No fault levels for this network.</p>
    );
  } else {
    panel = (
      <Suspense fallback={<p className="ks-panel-note">Drawing the profile…</p>}>
        <VoltageProfile document={network!} readings={readings} />
      </Suspense>
    );
  }

  return (
    <section className="ks-results" aria-labelledby="ks-results-title">
      <div className="ks-results-head">
        <h2 id="ks-results-title">Results</h2>
        <div role="tablist" aria-label="Results" className="ks-tabs" onKeyDown={onTabKey}>
          {tabs.map((tab) => (
            <button
              key={tab.id}
              ref={(el) => {
                tabRefs.current[tab.id] = el;
              }}
              type="button"
              role="tab"
              id={`ks-tab-${tab.id}`}
              aria-selected={active === tab.id}
              aria-controls="ks-results-panel"
              tabIndex={active === tab.id ? 0 : -1}
              className="ks-tab"
              onClick={() => setActive(tab.id)}
            >
              {tab.label}
            </button>
          ))}
        </div>
      </div>
      <p className="ks-caution">
        <span aria-hidden="true">⚠ </span>
        {RESULTS_CAUTION}
      </p>
      <div role="tabpanel" id="ks-results-panel" aria-labelledby={`ks-tab-${active}`} className="ks-results-panel" tabIndex={0}>
        {panel}
      </div>
    </section>
  );
}
