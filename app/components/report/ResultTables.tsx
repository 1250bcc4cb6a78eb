// The study report's tables of the solved network: buses, branches, fault levels and checks, built
// from the same rows and columns as the sheet's results and the CSV, every quantity with its unit
// and every status with an icon and words.
import { StatusText } from "#app/components/StatusText.tsx";
import { DataTable } from "#app/components/DataTable.tsx";
import { checkLine } from "#app/lib/checkText.ts";
import { fixed, readingAgainstLimit, readingNumber, readingText } from "#app/lib/format.ts";
import { lowerLimitStatus, statusCue, upperLimitStatus, voltageStatus } from "#app/lib/limitStatus.ts";
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
  tapWords,
  windingCurrents,
  type BranchRow,
  type BusRow,
  type FaultRow,
  type SourceRow,
} from "#solver/resultTables.ts";
import type { SolveResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { REPORT_TABLE, reportColumn as shared, TableScroll } from "./TableScroll.tsx";

export function BusTable({ network, result }: { network: Network; result: SolveResult }) {
  const c = busColumns;
  return (
    <TableScroll label="Bus voltages">
      <DataTable<BusRow>
        className={REPORT_TABLE}
        caption="Bus voltages"
        columns={[
          shared(c.name),
          shared(c.vPu, (r) => readingAgainstLimit(r.vPu, [r.vMinPu, r.vMaxPu], "pu")),
          { header: "Status", cell: (r) => <StatusText status={voltageStatus(r.vPu, r.vMinPu, r.vMaxPu)} /> },
          shared(c.vKV),
          shared(c.angleDeg),
          { ...shared(c.nominalKV), header: <>U<sub>n</sub></> },
          { header: "Band", unit: "pu", numeric: true, cell: (r) => `${fixed(r.vMinPu, 2)}–${fixed(r.vMaxPu, 2)}` },
        ]}
        rows={busRows(network, result)}
        rowKey={(r) => r.id}
      />
    </TableScroll>
  );
}

export function BranchTable({ network, result }: { network: Network; result: SolveResult }) {
  const c = branchColumns;
  const totals = result.loadFlow.totals;
  return (
    <TableScroll label="Branch flows and losses">
      <DataTable<BranchRow>
        className={REPORT_TABLE}
        caption="Branch flows and losses (each branch in the direction its active power flows; a transformer's current per winding)"
        columns={[
          shared(c.name, (r) => (
            <>
              {r.name}
              <span className="ks-cell-note">{BRANCH_KIND_WORDS[r.kind]}</span>
            </>
          )),
          shared(c.loadingPct, (r) => readingAgainstLimit(r.loadingPct, [100], "pct")),
          { header: "Status", cell: (r) => <StatusText status={r.loadingPct === null ? undefined : upperLimitStatus(r.loadingPct, 100, "pct")} /> },
          shared(c.pSendMW),
          shared(c.qSendMvar),
          shared(c.currentA, (r) => windingCurrents(r, (amps) => readingNumber(amps, "A"))),
          shared(c.lossKW),
          shared(c.route),
        ]}
        rows={branchRows(network, result)}
        rowKey={(r) => r.id}
        foot={
          <tr>
            <th scope="row" colSpan={6}>
              Losses in all (generation {readingText(totals.generationMW, "MW")}, load {readingText(totals.loadMW, "MW")})
            </th>
            <td className="num">{readingNumber(totals.lossMW * 1000, "kW")}</td>
            <td>{readingNumber(totals.lossPct, "pct")} % of generation</td>
          </tr>
        }
      />
    </TableScroll>
  );
}

export function FaultTable({ network, result }: { network: Network; result: SolveResult }) {
  const c = faultColumns;
  const againstBreaking = (kA: number | null, r: FaultRow) => (kA === null ? "unearthed" : readingAgainstLimit(kA, [r.breakingKA], "kA"));
  return (
    <TableScroll label="Short-circuit currents">
      <DataTable<FaultRow>
        className={REPORT_TABLE}
        caption={
          <>
            Initial short-circuit currents by IEC 60909-0 (maximum: c<sub>max</sub> 1.10 above 1 kV, 1.05 at or below)
          </>
        }
        columns={[
          {
            header: "Bus",
            cell: (r) => (
              <>
                {r.name}
                <span className="ks-cell-note">{readingText(r.nominalKV, "kV")}</span>
              </>
            ),
          },
          shared(c.ik3kA, (r) => againstBreaking(r.ik3kA, r)),
          shared(c.ik1kA, (r) => (
            <>
              {againstBreaking(r.ik1kA, r)}
              {r.note ? <span className="ks-cell-note">{r.note}</span> : null}
            </>
          )),
          { header: "Status", cell: (r) => <StatusText status={upperLimitStatus(Math.max(r.ik3kA, r.ik1kA ?? 0), r.breakingKA, "kA")} /> },
          shared(c.breakingKA),
          shared(c.ik3MVA),
          { ...shared(c.ip3kA), header: <>i<sub>p</sub></> },
          shared(c.rOverX),
        ]}
        rows={faultRows(network, result)}
        rowKey={(r) => r.id}
      />
    </TableScroll>
  );
}

/** The minimum case by IEC 60909-0 at every bus, against the minimum the planner asks where asked, and how i_p was found. */
export function MinimumFaultTable({ network, result }: { network: Network; result: SolveResult }) {
  const c = faultColumns;
  return (
    <TableScroll label="Minimum short-circuit currents">
      <DataTable<FaultRow>
        className={REPORT_TABLE}
        caption={
          <>
            Minimum short-circuit currents by IEC 60909-0 (c<sub>min</sub> 1.00 above 1 kV, 0.95 at or below; the weakest infeeds; lines and
            cables at 80 °C; no converter plants), and the method each bus's i<sub>p</sub> used
          </>
        }
        columns={[
          {
            header: "Bus",
            cell: (r) => (
              <>
                {r.name}
                <span className="ks-cell-note">{readingText(r.nominalKV, "kV")}</span>
              </>
            ),
          },
          shared(c.sk3MinMVA, (r) => readingAgainstLimit(r.sk3MinMVA, [r.minFaultMVA], "MVA")),
          { header: "Status", cell: (r) => <StatusText status={lowerLimitStatus(r.sk3MinMVA, r.minFaultMVA, "MVA")} none="no minimum asked" /> },
          shared(c.minFaultMVA),
          shared(c.ik3MinKA),
          shared(c.ik1MinKA, (r) => (r.ik1MinKA === null ? "unearthed" : readingNumber(r.ik1MinKA, "kA"))),
          shared(c.ipMethod),
        ]}
        rows={faultRows(network, result)}
        rowKey={(r) => r.id}
      />
    </TableScroll>
  );
}

/** Converter plants (output and short-circuit ratio) and regulating transformers (the tap chosen); nothing when the network has neither. */
export function EquipmentTables({ network, result }: { network: Network; result: SolveResult }) {
  const converters = sourceRows(network, result).filter((r) => r.kind === "converter");
  const taps = branchRows(network, result).filter((r) => r.regulating);
  const s = sourceColumns;
  const b = branchColumns;
  return (
    <>
      {converters.length > 0 ? (
        <TableScroll label="Converter plants">
          <DataTable<SourceRow>
            className={REPORT_TABLE}
            caption={`Converter plants: output, and the short-circuit ratio S″k3 min / rated MVA at the plant's bus (below the SCR asked, 3 unless the plant says, counts as weak)`}
            columns={[
              shared(s.name),
              shared(s.busName),
              shared(s.control),
              shared(s.pMW),
              shared(s.qMvar),
              shared(s.ratedMVA),
              shared(s.scr, (r) => readingAgainstLimit(r.scr ?? null, [r.scrAsked], "ratio")),
              shared(s.scrAsked),
              { header: "Status", cell: (r) => <StatusText status={lowerLimitStatus(r.scr, r.scrAsked, "ratio")} /> },
            ]}
            rows={converters}
            rowKey={(r) => r.id}
          />
        </TableScroll>
      ) : null}
      {taps.length > 0 ? (
        <TableScroll label="Regulating transformers">
          <DataTable<BranchRow>
            className={REPORT_TABLE}
            caption="Regulating transformers: the tap the on-load tap changer settled on"
            columns={[
              shared(b.name),
              shared(b.tapPct),
              { header: "Tap changer", cell: (r) => tapWords(r) },
              { header: "Status", cell: (r) => <StatusText status={r.tapLimited ? "beyond" : "within"} /> },
            ]}
            rows={taps}
            rowKey={(r) => r.id}
          />
        </TableScroll>
      ) : null}
    </>
  );
}

export function CheckList({ network, result }: { network: Network; result: SolveResult }) {
  if (result.checks.length === 0)
    return (
      <p className="ks-status ks-status-within">
        <span aria-hidden="true">{statusCue.within.icon}</span> Every voltage, loading, breaking current, minimum fault level and short-circuit ratio is within its limit.
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
