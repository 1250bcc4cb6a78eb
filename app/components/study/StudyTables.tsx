// A study's tables, for the study page and the report alike: the cases, the limits each case
// breaks, the envelope, the case × element table, N-1 with firm capacity, the years of load
// growth and the energy lost. Columns come from solver/study/tables.ts; every status has an icon
// and words; each table can be downloaded as CSV where the caller gives the address.
import type { ReactNode } from "react";
import { DataTable, type Column } from "#app/components/DataTable.tsx";
import { StatusText } from "#app/components/StatusText.tsx";
import { fixed, formatNumber, readingAgainstLimit, readingNumber } from "#app/lib/format.ts";
import { upperLimitStatus, voltageStatus, worstStatus } from "#app/lib/limitStatus.ts";
import type { StudyView } from "#app/lib/studyView.ts";
import { QUANTITY_UNIT } from "#solver/quantities.ts";
import type { StudyCsvTable } from "#solver/study/csv.ts";
import {
  branchEnvelopeColumns,
  busEnvelopeColumns,
  firmCapacityColumns,
  LIMIT_WORDS,
  limitQuantity,
  outageColumns,
  yearColumns,
  type BranchEnvelopeRow,
  type BusEnvelopeRow,
  type CaseElementRow,
  type FirmCapacityRow,
  type YearRow,
} from "#solver/study/tables.ts";
import type { ShownOutage } from "#app/lib/studyView.ts";
import { REPORT_TABLE, reportColumn as shared, TableScroll } from "#app/components/report/TableScroll.tsx";


function Cut({ shown, total, what }: { shown: number; total: number; what: string }) {
  if (shown >= total) return null;
  return (
    <p className="field-hint">
      Showing the first {shown.toLocaleString("en-GB")} of {total.toLocaleString("en-GB")} {what}; the CSV has every one.
    </p>
  );
}

function Download({ href, table }: { href?: (table: StudyCsvTable) => string; table: StudyCsvTable }) {
  if (!href) return null;
  return (
    <a className="btn btn-small ks-no-print" href={href(table)} download>
      CSV
    </a>
  );
}

function Heading({ id, level, children, href, table }: { id: string; level: 2 | 3; children: ReactNode; href?: (table: StudyCsvTable) => string; table?: StudyCsvTable }) {
  const H = level === 2 ? "h2" : "h3";
  return (
    <div className="ks-study-heading">
      <H id={id}>{children}</H>
      {table ? <Download href={href} table={table} /> : null}
    </div>
  );
}

export interface StudyTablesProps {
  view: StudyView;
  /** Where each table downloads as CSV; none in print. */
  csvHref?: (table: StudyCsvTable) => string;
  /** Headings one level under the page's (the report numbers its own parts). */
  level?: 2 | 3;
}

export function StudyTables({ view, csvHref, level = 2 }: StudyTablesProps) {
  const sub = (level + 1) as 3;
  return (
    <div className="ks-study">
      <section aria-labelledby="study-cases">
        <Heading id="study-cases" level={level}>
          Operating cases
        </Heading>
        <CaseTable view={view} />
      </section>

      <section aria-labelledby="study-checks">
        <Heading id="study-checks" level={level}>
          Limits broken, by case
        </Heading>
        {view.checks.total === 0 ? (
          <p>
            <StatusText status="within" /> Every bus voltage and branch loading is within its limit in every case.
          </p>
        ) : (
          <>
            <ul className="ks-study-checks">
              {view.checks.rows.map((c, i) => (
                <li key={`${c.caseId}-${c.element}-${c.kind}-${i}`}>
                  <span className="ks-status ks-status-beyond" aria-hidden="true">
                    ✕{" "}
                  </span>
                  <strong>{c.caseName}</strong>: {c.text}
                </li>
              ))}
            </ul>
            <Cut shown={view.checks.rows.length} total={view.checks.total} what="broken limits" />
          </>
        )}
      </section>

      <section aria-labelledby="study-envelope">
        <Heading id="study-envelope" level={level} href={csvHref} table="envelope">
          Envelope across the cases
        </Heading>
        <p className="field-hint">Each bus's lowest and highest voltage and each branch's highest loading over the cases, with the case that sets it.</p>
        <BusEnvelopeTable rows={view.busEnvelope.rows} />
        <Cut shown={view.busEnvelope.rows.length} total={view.busEnvelope.total} what="buses" />
        <BranchEnvelopeTable rows={view.branchEnvelope.rows} />
        <Cut shown={view.branchEnvelope.rows.length} total={view.branchEnvelope.total} what="branches" />
      </section>

      <section aria-labelledby="study-case-elements">
        <Heading id="study-case-elements" level={level} href={csvHref} table="cases">
          Case × element
        </Heading>
        <CaseElementTable view={view} />
        <Cut shown={view.caseElements.rows.length} total={view.caseElements.total} what="elements" />
      </section>

      {view.outages ? (
        <section aria-labelledby="study-outages">
          <Heading id="study-outages" level={level} href={csvHref} table="outages">
            Outages (N-1)
          </Heading>
          <p>
            {view.outages.total.toLocaleString("en-GB")} single outages of a line or transformer studied: {view.outages.lostLoadCount} lose load,{" "}
            {view.outages.brokenCount} break a limit where the network still supplies the load, {view.outages.notCarriedCount} leave a load flow that
            does not converge. Listed with the worst first.
          </p>
          <OutageTable rows={view.outages.rows} />
          <Cut shown={view.outages.rows.length} total={view.outages.total} what="outages" />
          <Heading id="study-firm" level={sub} href={csvHref} table="firm-capacity">
            Firm capacity
          </Heading>
          {view.firmCapacity && view.firmCapacity.length > 0 ? (
            <FirmTable rows={view.firmCapacity} />
          ) : (
            <p>No substation has transformers in parallel between the same two busbars, so there is no firm capacity to give.</p>
          )}
        </section>
      ) : null}

      {view.years && view.growth ? (
        <section aria-labelledby="study-years">
          <Heading id="study-years" level={level} href={csvHref} table="years">
            Years of load growth
          </Heading>
          <p>
            Load grows {fixed(view.growth.ratePctPerYear, 1)} % a year, compounded ((1 + g)<sup>n</sup>), over {view.growth.years} years.{" "}
            {view.growth.loadNotCarriedYear === null ? (
              <>The network carries its load in every case through year {view.growth.years}.</>
            ) : (
              <strong>
                The network stops carrying its load in year {view.growth.loadNotCarriedYear} (case “{view.growth.loadNotCarriedCaseName}”).
              </strong>
            )}
          </p>
          {view.years.total === 0 ? <p>No limit breaks within the horizon.</p> : <YearTable rows={view.years.rows} />}
          <Cut shown={view.years.rows.length} total={view.years.total} what="limits" />
        </section>
      ) : null}

      <section aria-labelledby="study-energy">
        <Heading id="study-energy" level={level}>
          Energy lost in a year
        </Heading>
        <p>
          {formatNumber(view.energy.lossMWhPerYear, 1)} MWh a year ({formatNumber(view.energy.loadDependentMWh, 1)} MWh in lines and windings,{" "}
          {formatNumber(view.energy.coreMWh, 1)} MWh in transformer cores),{" "}
          {view.energy.method === "case-hours"
            ? `summed over the cases' hours (${formatNumber(view.energy.hoursCovered, 0)} h of the year).`
            : `from the peak case's losses by the loss load factor (${fixed(view.energy.lossLoadFactor ?? 0, 3)}, load factor ${fixed(view.energy.loadFactor ?? 0, 2)}), since no case gives its hours.`}
        </p>
      </section>
    </div>
  );
}

function CaseTable({ view }: { view: StudyView }) {
  const energy = new Map(view.energy.byCase.map((e) => [e.case, e]));
  return (
    <TableScroll label="Operating cases">
      <DataTable
        className={REPORT_TABLE}
        columns={[
          { header: "Case", cell: (c) => c.name },
          { header: "Hours a year", unit: "h", numeric: true, cell: (c) => (c.hoursPerYear === null ? "–" : formatNumber(c.hoursPerYear, 0)) },
          {
            header: "Load flow",
            cell: (c) => (c.converged ? (c.message ? c.message : "converged") : <strong className="ks-status-beyond">did not converge{c.message ? `: ${c.message}` : ""}</strong>),
          },
          { header: "Load without supply", unit: "MW", numeric: true, cell: (c) => readingNumber(c.lostLoadMW, "MW") },
          { header: "Losses", unit: "MW", numeric: true, cell: (c) => readingNumber(energy.get(c.id)?.lossMW, "MW") },
        ]}
        rows={view.cases}
        rowKey={(c) => c.id}
      />
    </TableScroll>
  );
}

function BusEnvelopeTable({ rows }: { rows: BusEnvelopeRow[] }) {
  const c = busEnvelopeColumns;
  return (
    <TableScroll label="Bus voltage envelope">
      <DataTable<BusEnvelopeRow>
        className={REPORT_TABLE}
        caption="Bus voltages"
        columns={[
          shared(c.name),
          shared(c.nominalKV),
          shared(c.vMinPu, (r) => readingAgainstLimit(r.vMinPu, [r.bandLowPu, r.bandHighPu], "pu")),
          shared(c.vMinCase),
          shared(c.vMaxPu, (r) => readingAgainstLimit(r.vMaxPu, [r.bandLowPu, r.bandHighPu], "pu")),
          shared(c.vMaxCase),
          { header: "Band", unit: "pu", numeric: true, cell: (r) => `${fixed(r.bandLowPu, 2)}–${fixed(r.bandHighPu, 2)}` },
          {
            header: "Status",
            cell: (r) => <StatusText status={worstStatus([voltageStatus(r.vMinPu, r.bandLowPu, r.bandHighPu), voltageStatus(r.vMaxPu, r.bandLowPu, r.bandHighPu)])} />,
          },
        ]}
        rows={rows}
        rowKey={(r) => r.id}
      />
    </TableScroll>
  );
}

function BranchEnvelopeTable({ rows }: { rows: BranchEnvelopeRow[] }) {
  const c = branchEnvelopeColumns;
  return (
    <TableScroll label="Branch loading envelope">
      <DataTable<BranchEnvelopeRow>
        className={REPORT_TABLE}
        caption="Branch loadings"
        columns={[
          shared(c.name),
          shared(c.kind),
          shared(c.maxLoadingPct, (r) => readingAgainstLimit(r.maxLoadingPct, [100], "pct")),
          shared(c.maxLoadingCase),
          { header: "Status", cell: (r) => <StatusText status={upperLimitStatus(r.maxLoadingPct, 100, "pct")} /> },
        ]}
        rows={rows}
        rowKey={(r) => r.id}
      />
    </TableScroll>
  );
}

function CaseElementTable({ view }: { view: StudyView }) {
  const value = (row: CaseElementRow, v: number | null) => {
    if (v === null) return <span className="ks-muted">–</span>;
    const status = row.quantity === "pu" ? voltageStatus(v, row.low ?? 0, row.high) : upperLimitStatus(v, row.high, "pct");
    const text = readingAgainstLimit(v, row.quantity === "pu" ? [row.low ?? undefined, row.high] : [row.high], row.quantity);
    return status === "beyond" ? (
      <strong className="ks-status-beyond">
        <span aria-hidden="true">✕ </span>
        {text}
        <span className="sr-only"> (beyond a limit)</span>
      </strong>
    ) : (
      text
    );
  };
  const columns: [Column<CaseElementRow>, ...Column<CaseElementRow>[]] = [
    { header: "Element", cell: (r) => r.name },
    { header: "Reading", cell: (r) => (r.quantity === "pu" ? "voltage, pu" : "loading, %") },
    ...view.cases.map((c, i): Column<CaseElementRow> => ({ header: c.name, numeric: true, cell: (r) => value(r, r.values[i]) })),
  ];
  return (
    <TableScroll label="Case by element">
      <DataTable<CaseElementRow>
        className={REPORT_TABLE}
        caption="Each bus's voltage and each rated branch's loading in each case (– where the element has no supply or the case did not converge)"
        columns={columns}
        rows={view.caseElements.rows}
        rowKey={(r) => `${r.kind}-${r.id}`}
      />
    </TableScroll>
  );
}

function OutageTable({ rows }: { rows: ShownOutage[] }) {
  const c = outageColumns;
  return (
    <TableScroll label="Outages">
      <DataTable<ShownOutage>
        className={REPORT_TABLE}
        caption="Each line and transformer out in turn, in each case studied"
        columns={[
          shared(c.elementName),
          shared(c.caseName),
          shared(c.lostLoadMW, (r) => (r.lostLoadMW > 0 ? <strong>{readingNumber(r.lostLoadMW, "MW")}</strong> : readingNumber(r.lostLoadMW, "MW"))),
          { header: "Carried", cell: (r) => (r.converged ? "yes" : <strong className="ks-status-beyond">no: the load flow does not converge</strong>) },
          {
            header: "Limits broken",
            cell: (r) =>
              r.checkLines.length === 0 ? (
                <span className="ks-muted">none</span>
              ) : (
                <ul className="ks-study-cell-list">
                  {r.checkLines.map((line) => (
                    <li key={line}>{line}</li>
                  ))}
                </ul>
              ),
          },
          shared(c.highestLoadingName),
          shared(c.highestLoadingPct, (r) => readingAgainstLimit(r.highestLoadingPct, [100], "pct")),
          shared(c.lowestVoltageName),
          shared(c.lowestVoltagePu),
        ]}
        rows={rows}
        rowKey={(r) => r.key}
      />
    </TableScroll>
  );
}

function FirmTable({ rows }: { rows: FirmCapacityRow[] }) {
  const c = firmCapacityColumns;
  return (
    <TableScroll label="Firm capacity">
      <DataTable<FirmCapacityRow>
        className={REPORT_TABLE}
        caption="Substations with transformers in parallel: what they hold with the largest unit out"
        columns={[
          shared(c.substation),
          shared(c.transformers),
          shared(c.installedMVA),
          shared(c.firmMVA),
          shared(c.peakDemandMVA, (r) => readingAgainstLimit(r.peakDemandMVA, [r.firmMVA], "MVA")),
          shared(c.peakCase),
          { header: "Status", cell: (r) => (r.withinFirm ? <StatusText status="within" /> : <StatusText status="beyond" />) },
        ]}
        rows={rows}
        rowKey={(r) => r.key}
      />
    </TableScroll>
  );
}

function YearTable({ rows }: { rows: YearRow[] }) {
  const c = yearColumns;
  const reading = (r: YearRow, v: number) => {
    const quantity = limitQuantity(r.kind);
    return r.kind === "not-converged" ? `${readingNumber(v, quantity)} % of load` : `${readingAgainstLimit(v, [r.limit], quantity)} ${QUANTITY_UNIT[quantity]}`;
  };
  return (
    <TableScroll label="First year each limit breaks">
      <DataTable<YearRow>
        className={REPORT_TABLE}
        caption="The first year each limit breaks (year 0 is the load as drawn)"
        columns={[
          shared(c.elementName),
          { header: "Limit", cell: (r) => LIMIT_WORDS[r.kind] },
          { header: "First year", numeric: true, cell: (r) => String(r.firstYear) },
          shared(c.caseName),
          { header: "Value", numeric: true, cell: (r) => reading(r, r.value) },
          { header: "Limit value", numeric: true, cell: (r) => (r.kind === "not-converged" ? "–" : `${readingNumber(r.limit, limitQuantity(r.kind))} ${QUANTITY_UNIT[limitQuantity(r.kind)]}`) },
        ]}
        rows={rows}
        rowKey={(r) => r.key}
      />
    </TableScroll>
  );
}
