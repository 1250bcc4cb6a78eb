// Results under the sheet: buses, branches, sources, totals and fault levels as sortable tables,
// the voltage profile along the chain, CSV downloads, and the caution every results view carries.
import { lazy, Suspense, useMemo, useRef, useState, useSyncExternalStore, type KeyboardEvent, type ReactNode } from "react";
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type Row,
  type SortingState,
} from "@tanstack/react-table";
import type { Network } from "#solver/schema.ts";
import type { CsvTable } from "#solver/csv.ts";
import { StatusText } from "#app/components/StatusText.tsx";
import { fixed, readingAgainstLimit, readingNumber } from "#app/lib/format.ts";
import { lowerLimitStatus, statusSeverity, upperLimitStatus, voltageStatus, worstStatus, type LimitStatus } from "#app/lib/limitStatus.ts";
import { QUANTITY_UNIT } from "#solver/quantities.ts";
import {
  BRANCH_KIND_WORDS,
  branchColumns,
  branchRows,
  busColumns,
  busRows,
  faultColumns,
  faultRows,
  sourceColumns,
  sourceRows,
  windingCurrents,
  type BranchRow,
  type BusRow,
  type FaultRow,
  type ResultColumn,
  type SourceRow,
} from "#solver/resultTables.ts";
import { branchEnvelopeColumns, busEnvelopeColumns, type BranchEnvelopeRow, type BusEnvelopeRow } from "#solver/study/tables.ts";
import { useSheet, type EnvelopeReadings, type Readings } from "./sheetStore.ts";

const VoltageProfile = lazy(() => import("./VoltageProfile.tsx"));

export const RESULTS_CAUTION =
  "Results are for planning-stage screening. Verify them against the applicable grid code, local regulations and the equipment makers' data, and have protection settings and construction designs done and approved by licensed engineers. Fault levels by IEC 60909-0 are not a protection study.";

interface ColumnMeta {
  numeric?: boolean;
  unit?: string;
  /** The row's name: kept in view while the table scrolls sideways. */
  sticky?: boolean;
}

/** A shared results column as a sortable column: figures at their quantity's precision. */
function shared<T>(column: ResultColumn<T>, cell?: (row: T) => ReactNode): ColumnDef<T> {
  const numeric = column.quantity !== undefined;
  return {
    id: column.key,
    accessorFn: (row) => column.value(row) ?? (numeric ? null : ""),
    header: column.header,
    meta: { numeric, unit: column.quantity ? QUANTITY_UNIT[column.quantity] : undefined } satisfies ColumnMeta,
    cell: (info) => (cell ? cell(info.row.original) : numeric ? readingNumber(info.getValue() as number | null, column.quantity!) : String(info.getValue() ?? "")),
    sortUndefined: "last",
  };
}

function named<T>(column: ResultColumn<T>): ColumnDef<T> {
  return { ...shared(column), meta: { sticky: true } satisfies ColumnMeta };
}

function statusColumn<T>(statusOf: (row: T) => LimitStatus | undefined): ColumnDef<T> {
  return {
    id: "status",
    accessorFn: (row) => {
      const status = statusOf(row);
      return status ? statusSeverity[status] : -1;
    },
    header: "Status",
    cell: (info) => <StatusText status={statusOf(info.row.original)} none="no limit" />,
  };
}

function cellClass(meta: ColumnMeta | undefined): string | undefined {
  return [meta?.numeric ? "num" : "", meta?.sticky ? "ks-sticky-name" : ""].filter(Boolean).join(" ") || undefined;
}

/** A phone's width (sheet.css stacks the workspace below it): results become a list of cards. */
const NARROW_QUERY = "(max-width: 767px)";

function subscribeNarrow(onChange: () => void) {
  const query = window.matchMedia(NARROW_QUERY);
  query.addEventListener("change", onChange);
  return () => query.removeEventListener("change", onChange);
}

function useNarrow(): boolean {
  return useSyncExternalStore(
    subscribeNarrow,
    () => window.matchMedia(NARROW_QUERY).matches,
    () => false,
  );
}

/** Figures a card shows under the element's name and status: the table's first columns. */
const CARD_FIGURES = 6;

/**
 * The phone's results: one card per element with its status and key figures, the elements that
 * break a limit first (then those near one), so the list starts with what Checks names.
 */
function ResultCards<T>({ caption, rows }: { caption: string; rows: Row<T>[] }) {
  const severity = (row: Row<T>) => (row.getAllCells().some((c) => c.column.id === "status") ? (row.getValue("status") as number) : -1);
  const ordered = rows.map((row, i) => ({ row, i })).sort((a, b) => severity(b.row) - severity(a.row) || a.i - b.i);
  return (
    <ul className="ks-result-cards" aria-label={caption}>
      {ordered.map(({ row }) => {
        const cells = row.getVisibleCells();
        const name = cells.find((c) => (c.column.columnDef.meta as ColumnMeta | undefined)?.sticky);
        const status = cells.find((c) => c.column.id === "status");
        const figures = cells.filter((c) => c !== name && c !== status).slice(0, CARD_FIGURES);
        return (
          <li key={row.id} className="ks-result-card">
            <div className="ks-result-card-head">
              <span className="ks-result-card-name">{name ? flexRender(name.column.columnDef.cell, name.getContext()) : null}</span>
              {status ? flexRender(status.column.columnDef.cell, status.getContext()) : null}
            </div>
            <dl>
              {figures.map((cell) => {
                const meta = cell.column.columnDef.meta as ColumnMeta | undefined;
                return (
                  <div key={cell.id}>
                    <dt>
                      {typeof cell.column.columnDef.header === "string" ? cell.column.columnDef.header : cell.column.id}
                      {meta?.unit ? ` (${meta.unit})` : null}
                    </dt>
                    <dd className={meta?.numeric ? "num" : undefined}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</dd>
                  </div>
                );
              })}
            </dl>
          </li>
        );
      })}
    </ul>
  );
}

function ResultsTable<T>({ caption, data, columns }: { caption: string; data: T[]; columns: ColumnDef<T>[] }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const narrow = useNarrow();
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  if (narrow) return <ResultCards caption={caption} rows={table.getRowModel().rows} />;
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
                    className={cellClass(meta)}
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
                  <td key={cell.id} className={cellClass(meta)}>
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

const bus = busColumns;
const busTable: ColumnDef<BusRow>[] = [
  named(bus.name),
  shared(bus.vPu, (r) => readingAgainstLimit(r.vPu, [r.vMinPu, r.vMaxPu], "pu")),
  statusColumn((r) => voltageStatus(r.vPu, r.vMinPu, r.vMaxPu)),
  shared(bus.vKV),
  shared(bus.angleDeg),
  shared(bus.nominalKV),
  { id: "band", accessorFn: (r) => `${r.vMinPu}–${r.vMaxPu}`, header: "Band (pu)" },
];

const branch = branchColumns;
const loadingStatus = (r: BranchRow) => (r.loadingPct === null ? undefined : upperLimitStatus(r.loadingPct, 100, "pct"));
const branchTable: ColumnDef<BranchRow>[] = [
  named(branch.name),
  shared(branch.loadingPct, (r) => readingAgainstLimit(r.loadingPct, [100], "pct")),
  statusColumn(loadingStatus),
  shared(branch.pSendMW),
  shared(branch.qSendMvar),
  shared(branch.currentA, (r) => windingCurrents(r, (amps) => readingNumber(amps, "A"))),
  shared(branch.lossKW),
  shared(branch.route),
  shared(branch.pReceiveMW),
  shared(branch.qReceiveMvar),
  { id: "kind", accessorFn: (r) => BRANCH_KIND_WORDS[r.kind], header: "Kind" },
  shared(branch.tapPct),
  shared(branch.tapNote),
];

const source = sourceColumns;
const sourceTable: ColumnDef<SourceRow>[] = [
  named(source.name),
  shared(source.pMW),
  shared(source.qMvar),
  shared(source.busName),
  shared(source.kind),
  shared(source.control),
  shared(source.scr, (r) => readingAgainstLimit(r.scr ?? null, [r.scrAsked], "ratio")),
  shared(source.scrAsked),
  shared(source.ratedMVA),
];

const fault = faultColumns;
const faultStatus = (r: FaultRow) =>
  worstStatus([upperLimitStatus(Math.max(r.ik3kA, r.ik1kA ?? 0), r.breakingKA, "kA"), lowerLimitStatus(r.sk3MinMVA, r.minFaultMVA, "MVA")]);
const againstBreaking = (kA: number | null, r: FaultRow) => (kA === null ? "unearthed" : readingAgainstLimit(kA, [r.breakingKA], "kA"));
const faultTable: ColumnDef<FaultRow>[] = [
  named({ key: "name", header: "Bus", value: (r) => r.name }),
  shared(fault.ik3kA, (r) => againstBreaking(r.ik3kA, r)),
  shared(fault.ik1kA, (r) => againstBreaking(r.ik1kA, r)),
  statusColumn(faultStatus),
  shared(fault.breakingKA),
  shared(fault.ik3MVA),
  shared(fault.ip3kA),
  shared(fault.sk3MinMVA, (r) => readingAgainstLimit(r.sk3MinMVA, [r.minFaultMVA], "MVA")),
  shared(fault.minFaultMVA),
  shared(fault.ik3MinKA),
  shared(fault.ik1MinKA, (r) => (r.ik1MinKA === null ? "unearthed" : readingNumber(r.ik1MinKA, "kA"))),
  shared(fault.rOverX),
  shared(fault.ipMethod),
  shared({ key: "nominalKV", header: "Nominal", quantity: "kV", value: (r) => r.nominalKV }),
  shared(fault.note),
];

const busEnvelope = busEnvelopeColumns;
const busEnvelopeTable: ColumnDef<BusEnvelopeRow>[] = [
  named(busEnvelope.name),
  shared(busEnvelope.vMinPu, (r) => readingAgainstLimit(r.vMinPu, [r.bandLowPu, r.bandHighPu], "pu")),
  shared(busEnvelope.vMinCase),
  shared(busEnvelope.vMaxPu, (r) => readingAgainstLimit(r.vMaxPu, [r.bandLowPu, r.bandHighPu], "pu")),
  shared(busEnvelope.vMaxCase),
  statusColumn((r) => worstStatus([voltageStatus(r.vMinPu, r.bandLowPu, r.bandHighPu), voltageStatus(r.vMaxPu, r.bandLowPu, r.bandHighPu)])),
  shared(busEnvelope.nominalKV),
  { id: "band", accessorFn: (r) => `${r.bandLowPu}–${r.bandHighPu}`, header: "Band (pu)" },
];

const branchEnvelope = branchEnvelopeColumns;
const branchEnvelopeTable: ColumnDef<BranchEnvelopeRow>[] = [
  named(branchEnvelope.name),
  shared(branchEnvelope.maxLoadingPct, (r) => readingAgainstLimit(r.maxLoadingPct, [100], "pct")),
  shared(branchEnvelope.maxLoadingCase),
  statusColumn((r) => upperLimitStatus(r.maxLoadingPct, 100, "pct")),
  shared(branchEnvelope.kind),
];

/** The envelope's tabs: bus voltages and branch loadings; the rest belong to one case at a time. */
function envelopePanel(active: TabId, envelope: EnvelopeReadings): ReactNode {
  if (active === "buses")
    return (
      <>
        <ResultsTable caption="Bus voltage envelope: the lowest and highest over the operating cases" data={[...envelope.buses.values()]} columns={busEnvelopeTable} />
        <p className="ks-muted ks-results-foot">Each bus's lowest and highest voltage over the {envelope.study.cases.length} operating cases, with the case that sets it; the study page has every case's table and CSV.</p>
      </>
    );
  if (active === "branches")
    return (
      <>
        <ResultsTable caption="Branch loading envelope: the highest over the operating cases" data={[...envelope.branches.values()]} columns={branchEnvelopeTable} />
        <p className="ks-muted ks-results-foot">Each rated line's and transformer's highest loading over the operating cases, with the case that sets it.</p>
      </>
    );
  return <p className="ks-panel-note">The envelope gives bus voltages and branch loadings; pick one operating case above the sheet for its sources, totals, fault levels and profile.</p>;
}

function rowsFor(doc: Network, readings: Readings) {
  const result = readings.result;
  return { buses: busRows(doc, result), branches: branchRows(doc, result), sources: sourceRows(doc, result), faults: faultRows(doc, result) };
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

function CsvLink({ table, csvBase, revision }: { table: CsvTable; csvBase: string | null; revision: number }) {
  const caseShown = useSheet((s) => s.solve.kind === "solved" && s.solve.readings.shownCase !== undefined);
  if (csvBase === null) return null;
  return (
    <a className="btn btn-small" href={`${csvBase}/results.csv?table=${table}`} download>
      Download CSV of {table} <span className="ks-muted">(saved revision {revision}{caseShown ? ", as drawn" : ""})</span>
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
  const shownName = solve.kind === "envelope" ? "envelope of all cases" : readings?.shownCase?.name;

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
  if (solve.kind === "envelope") {
    panel = envelopePanel(active, solve.envelope);
  } else if (!readings || !rows) {
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
        <ResultsTable caption="Bus voltages" data={rows.buses} columns={busTable} />
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
        <ResultsTable caption="Branch flows" data={rows.branches} columns={branchTable} />
        <div className="ks-results-foot">
          <CsvLink table="branches" csvBase={csvFrom} revision={savedRevision} />
          <p className="ks-muted">
            Each branch is listed in the direction its active power flows, as the drawing's arrows show: P and Q enter at the
            first bus named, P out and Q out leave at the second. A transformer's current is given for each winding. Loss is
            I²R for lines, copper plus core for transformers. The CSV keeps the network file's own from and to ends.
          </p>
        </div>
      </>
    );
  } else if (active === "sources") {
    panel = (
      <>
        <ResultsTable caption="Source outputs" data={rows.sources} columns={sourceTable} />
        <div className="ks-results-foot">
          <CsvLink table="sources" csvBase={csvFrom} revision={savedRevision} />
          <p className="ks-muted">SCR: a converter plant's short-circuit ratio, S″k3 min at its bus over its rated MVA below the SCR asked counts as weak: the plant's own lowest SCR in Details, 3 when it gives none.</p>
        </div>
      </>
    );
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
        <ResultsTable caption="Fault levels by IEC 60909-0" data={rows.faults} columns={faultTable} />
        <p className="ks-muted ks-results-foot">
          IEC 60909-0 equivalent voltage source at each bus: I″k3, I″k1 and ip with c max (converter plants as current
          sources), the minimum case with c min, the weakest infeeds, conductors at 80 °C and no converters. The status compares
          the larger of I″k3 and I″k1 with the switchgear breaking current, and S″k3 min with the minimum asked of the bus.
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
        <h2 id="ks-results-title">
          Results
          {shownName ? <span className="ks-results-case"> · {shownName}</span> : null}
        </h2>
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
        {/* A line beside the tabs, so the caution never takes the rows' place; opened, it says it all. */}
        <details className="ks-caution">
          <summary>
            <span aria-hidden="true">⚠ </span>For screening only
          </summary>
          {RESULTS_CAUTION}
        </details>
      </div>
      <div role="tabpanel" id="ks-results-panel" aria-labelledby={`ks-tab-${active}`} className="ks-results-panel" tabIndex={0}>
        {panel}
      </div>
    </section>
  );
}
