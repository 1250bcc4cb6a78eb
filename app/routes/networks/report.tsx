import { Link } from "react-router";
import type { Route } from "./+types/report";
import { CostPlot } from "#app/components/ladder/CostPlot.tsx";
import { LadderComparison, SensitivityTable } from "#app/components/ladder/LadderTables.tsx";
import { fixed, kvText } from "#app/lib/format.ts";
import { LossPlot } from "#app/components/ladder/LossPlot.tsx";
import { MoneySummary, UnitCostNote } from "#app/components/ladder/MoneyInputs.tsx";
import { defaultProfileEnd, ProfilePlot } from "#app/components/ladder/ProfilePlot.tsx";
import { InputTables } from "#app/components/report/InputTables.tsx";
import { BranchTable, BusTable, CheckList, EquipmentTables, FaultTable, MinimumFaultTable } from "#app/components/report/ResultTables.tsx";
import { SingleLineDrawing } from "#app/components/report/SingleLineDrawing.tsx";
import { StudyInputs } from "#app/components/report/StudyInputs.tsx";
import { StudySection, type ReportStudy } from "#app/components/report/StudySection.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { formatDate, formatDateTime } from "#app/lib/format.ts";
import { savedLadderStudy } from "#app/lib/ladder.server.ts";
import { networkReader } from "#app/lib/networkReader.server.ts";
import { REPORT_ROWS_MAX, type ReportExtent } from "#app/lib/reportExtent.ts";
import type { ReportStudyShape } from "#app/lib/compute/tasks.ts";
import { currentRevisionHeading, teamNameOf } from "#app/lib/networks.server.ts";
import { computeRefusal, computeRefusalOf, revisionReport } from "#app/lib/compute/results.server.ts";
import { DRAWING_MAX_BUSES } from "#app/components/report/singleLineLayout.ts";
import { keptStudyOnNetwork } from "#app/lib/study.server.ts";
import { studyView } from "#app/lib/studyView.ts";
import { LOAD_FLOW_METHOD, MAX_ITERATIONS, MISMATCH_TOLERANCE_PU } from "#solver/index.ts";
import { ladderRequestSchema, type AlternativeOverrides } from "#solver/ladder.ts";
import "#app/components/report/drawing.css";
import "#app/components/ladder/ladder.css";
import "#app/components/report/report.css";

/** Printed charts are drawn at a fixed width that fits A4 and Letter with the page margins. */
const PRINT_CHART_WIDTH = 660;

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Study report · ${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  // Also mapped at /s/:token/report: a view-link holder reads the same report without an account.
  const { network, user, actor, home, viaLink } = await networkReader(db, request, params);
  const [revision, team, saved] = await Promise.all([currentRevisionHeading(db, network), teamNameOf(db, network), savedLadderStudy(db, network.id)]);
  const report = await revisionReport(db, network, saved.study, actor).catch((failure) => computeRefusal(failure, "page"));
  // A large network's report lists the first part of each table (cut in the worker): the page stays a few hundred kilobytes.
  const ladderRun = report.ok ? report.ladder : null;
  const reportStudy = report.ok ? await studyOfReport(db, network, report.shape, actor) : { view: null, error: null, withYears: false, skipped: null };
  const overrides = saved.study ? (ladderRequestSchema.parse(saved.study.request).overrides as (AlternativeOverrides | null)[] | undefined) : undefined;
  return {
    id: network.id,
    name: network.name,
    team,
    preparedBy: user?.name ?? "a reviewer holding a view link",
    home,
    viaLink,
    preparedAt: new Date().toISOString(),
    revision: { number: network.current_revision, savedAt: revision.createdAt, by: revision.authorName, message: revision.message },
    solved: report.ok ? { network: report.network, result: report.result } : null,
    extent: report.ok ? report.extent : null,
    // Where this reader downloads every row: the API for the team, the link's own address for a view link.
    csvBase: viaLink ? home : `/api/networks/${network.id}`,
    documentIssues: report.ok ? [] : report.issues,
    study: saved.study ? { ...saved.study, overrides } : null,
    studyUnreadable: saved.unreadable,
    ladder: ladderRun?.ok ? ladderRun.ladder : null,
    ladderIssues: ladderRun && !ladderRun.ok ? ladderRun.issues : [],
    drawing: report.ok ? report.drawing : null,
    reportStudy,
  };
}

/** Load flows the report's study may ask for; a larger N-1 or years study is left to the study page. */
const REPORT_STUDY_LOAD_FLOWS_MAX = 1_500;

/** The operating cases with N-1, and the years when the network gives a growth; a refusal becomes the section's sentence. */
async function studyOfReport(
  db: Awaited<ReturnType<typeof getDb>>,
  network: Parameters<typeof keptStudyOnNetwork>[1],
  shape: ReportStudyShape,
  actor: Parameters<typeof revisionReport>[3],
): Promise<ReportStudy> {
  const cases = Math.max(1, shape.cases);
  const outageFlows = cases * shape.branches;
  const yearFlows = cases * (shape.growthYears ?? 0);
  const outages = cases + outageFlows <= REPORT_STUDY_LOAD_FLOWS_MAX;
  const withYears = shape.growthYears !== null && cases + (outages ? outageFlows : 0) + yearFlows <= REPORT_STUDY_LOAD_FLOWS_MAX;
  const left = [outages ? "" : `N-1 (${outageFlows.toLocaleString("en-GB")} load flows)`, shape.growthYears !== null && !withYears ? `the years (${yearFlows.toLocaleString("en-GB")} load flows)` : ""].filter(Boolean);
  const skipped = left.length > 0 ? `${left.join(" and ")} ${left.length > 1 ? "are" : "is"} too large for a report of this network; run ${left.length > 1 ? "them" : "it"} on the study page.` : null;
  try {
    const run = await keptStudyOnNetwork(db, network, { outages, years: withYears }, actor);
    if (!run.ok) return { view: null, error: run.error, withYears, skipped };
    return { view: studyView(run.document, run.study), error: null, withYears, skipped };
  } catch (failure) {
    return { view: null, error: computeRefusalOf(failure).error, withYears, skipped };
  }
}


const counted = (n: number, one: string, many: string) => `${n.toLocaleString("en-GB")} ${n === 1 ? one : many}`;

/** Said under a table a large network's report lists only the first part of. */
function ListedPart({ extent, csvBase }: { extent: ReportExtent; csvBase: string }) {
  if (!extent.trimmed) return null;
  return (
    <p className="text-sm text-ink-soft">
      This network has {counted(extent.buses.total, "bus", "buses")} and {counted(extent.branches.total, "branch", "branches")}: the tables list the first{" "}
      {extent.buses.listed.toLocaleString("en-GB")} buses in the file's order (at most {REPORT_ROWS_MAX} besides those a listed limit names) and the
      elements among them. Every row is in the CSV downloads: <a href={`${csvBase}/results.csv?table=buses`}>buses</a> and{" "}
      <a href={`${csvBase}/results.csv?table=branches`}>branches</a>.
    </p>
  );
}

export default function ReportPage({ loaderData }: Route.ComponentProps) {
  const { id, name, solved, study, ladder, home, viaLink, extent, csvBase } = loaderData;
  return (
    <article className="ks-report" aria-labelledby="report-title">
      <div className="ks-report-tools">
        <Link to={home}>← {name}</Link>
        <span className="flex-1" />
        <Link to={`${home}/study`} className="btn btn-small">
          Study
        </Link>
        {viaLink ? null : (
          <Link to={`/networks/${id}/ladder`} className="btn btn-small">
            Voltage ladder
          </Link>
        )}
        <button type="button" className="btn btn-primary btn-small" onClick={() => window.print()}>
          Print
        </button>
      </div>

      <header className="ks-report-head">
        <p className="ks-report-kicker">Kilostep study report</p>
        <h1 id="report-title">{name}</h1>
        <dl className="ks-report-facts">
          <dt>Team</dt>
          <dd>{loaderData.team}</dd>
          <dt>Revision</dt>
          <dd>
            {loaderData.revision.number}, saved {formatDateTime(loaderData.revision.savedAt)}
            {loaderData.revision.by ? ` by ${loaderData.revision.by}` : ""}
            {loaderData.revision.message ? ` (“${loaderData.revision.message}”)` : ""}
          </dd>
          <dt>Prepared</dt>
          <dd>
            {formatDate(loaderData.preparedAt)} by {loaderData.preparedBy}
          </dd>
          <dt>Status</dt>
          <dd>Planning-stage screening; see the cautions at the end.</dd>
        </dl>
      </header>

      {!solved ? (
        <Notice tone="error">
          This revision no longer passes the network file's checks, so it cannot be solved:{" "}
          {loaderData.documentIssues.map((i) => `${i.path || "document"}: ${i.message}`).join("; ")}.
        </Notice>
      ) : (
        <>
          <section className="ks-report-part" aria-labelledby="report-network">
            <h2 id="report-network">1. The network</h2>
            <p>
              {[
                counted(extent!.counts.buses, "bus", "buses"),
                counted(extent!.counts.transformers, "transformer", "transformers"),
                counted(extent!.counts.lines, "line or cable", "lines and cables"),
                counted(extent!.counts.loads, "load", "loads"),
                counted(extent!.counts.shunts, "shunt", "shunts"),
              ].join(", ")}
              ; {solved.network.frequencyHz} Hz, system base {solved.network.baseMVA} MVA. Bus voltages from the load flow are written under each bus.
            </p>
            {loaderData.drawing ? (
            <figure className="ks-report-figure">
              <SingleLineDrawing
                layout={loaderData.drawing}
                network={solved.network}
                label={`Single-line drawing of ${name}`}
                busNotes={Object.fromEntries(solved.result.loadFlow.converged ? solved.result.loadFlow.buses.map((b) => [b.id, `${fixed(b.vPu, 3)} pu`]) : [])}
              />
              <figcaption>Single-line drawing, computed from the network file: the source on the left, each branch a column further on.</figcaption>
            </figure>
            ) : (
              <p>
                The single-line drawing is left out: the network has {extent!.counts.buses.toLocaleString("en-GB")} buses, more than the{" "}
                {DRAWING_MAX_BUSES} a printed page can show legibly.
              </p>
            )}
          </section>

          <section className="ks-report-part" aria-labelledby="report-flow">
            <h2 id="report-flow">2. Load flow</h2>
            {solved.result.loadFlow.converged ? (
              <>
                <p>
                  Converged in {solved.result.loadFlow.iterations} iterations. Generation {fixed(solved.result.loadFlow.totals.generationMW, 3)} MW, load{" "}
                  {fixed(solved.result.loadFlow.totals.loadMW, 3)} MW, losses {fixed(solved.result.loadFlow.totals.lossMW, 3)} MW (
                  {fixed(solved.result.loadFlow.totals.lossPct, 2)} % of generation).
                </p>
                <BusTable network={solved.network} result={solved.result} />
                <BranchTable network={solved.network} result={solved.result} />
                <EquipmentTables network={solved.network} result={solved.result} />
                <ListedPart extent={extent!} csvBase={csvBase} />
              </>
            ) : (
              <Notice tone="error">{solved.result.loadFlow.message ?? "The load flow did not converge."}</Notice>
            )}
          </section>

          <section className="ks-report-part" aria-labelledby="report-faults">
            <h2 id="report-faults">3. Fault levels</h2>
            <FaultTable network={solved.network} result={solved.result} />
            <MinimumFaultTable network={solved.network} result={solved.result} />
          </section>

          <section className="ks-report-part" aria-labelledby="report-checks">
            <h2 id="report-checks">4. Checks</h2>
            <CheckList network={solved.network} result={solved.result} />
            {extent!.checks.total > extent!.checks.listed ? (
              <p className="text-sm text-ink-soft">
                The first {extent!.checks.listed.toLocaleString("en-GB")} of {extent!.checks.total.toLocaleString("en-GB")} broken limits are listed; the
                CSV downloads carry every bus and branch.
              </p>
            ) : null}
          </section>

          <StudySection study={loaderData.reportStudy} number={5} studyHref={`${home}/study`} />

          <section className="ks-report-part ks-report-ladder" aria-labelledby="report-ladder">
            <h2 id="report-ladder">6. Voltage ladder</h2>
            {study && ladder ? (
              <>
                <p>
                  The section at {kvText(ladder.section.nominalKV)} (buses{" "}
                  {ladder.section.busIds.map((busId) => solved.network.buses.find((b) => b.id === busId)?.name ?? busId).join(", ")}) compared at{" "}
                  {ladder.alternatives.map((a) => kvText(a.voltageKV)).join(", ")}. Study saved by {study.updatedByName ?? "a former member"},{" "}
                  {formatDateTime(study.updatedAt)}, on revision {study.networkRevision}
                  {study.networkRevision !== loaderData.revision.number ? `; solved here on revision ${loaderData.revision.number}` : ""}.
                </p>
                <div className={`notice ${ladder.cheapest?.withinLimits ? "notice-ok" : "notice-info"} ks-keep`}>
                  <p className="font-semibold">
                    <span aria-hidden="true">★ </span>
                    {ladder.cheapest ? `Recommended: ${kvText(ladder.cheapest.voltageKV)}` : "No alternative carries the load"}
                  </p>
                  {ladder.cheapest ? <p>{ladder.cheapest.note}</p> : null}
                </div>
                <LadderComparison ladder={ladder} network={solved.network} />
                <SensitivityTable ladder={ladder} />
                <StudyInputs ladder={ladder} network={solved.network} overrides={study.overrides} />
                <div className="ks-report-plots">
                  <LossPlot ladder={ladder} width={PRINT_CHART_WIDTH} height={240} />
                  <CostPlot ladder={ladder} width={PRINT_CHART_WIDTH} height={240} />
                  {/* The profile follows the chain through the whole network, which a large report does not carry. */}
                  {extent!.trimmed ? null : (
                    <ProfilePlot ladder={ladder} network={solved.network} endBusId={defaultProfileEnd(ladder, solved.network)} width={PRINT_CHART_WIDTH} height={250} />
                  )}
                </div>
                <h3>Money inputs</h3>
                <MoneySummary money={ladder.money} />
                <UnitCostNote money={ladder.money} />
              </>
            ) : study && loaderData.ladderIssues.length > 0 ? (
              <Notice tone="error">
                The saved study does not run on revision {loaderData.revision.number}:{" "}
                {loaderData.ladderIssues.map((i) => `${i.path ? `${i.path} ` : ""}${i.message}`).join("; ")}.
              </Notice>
            ) : (
              <p>
                No voltage ladder study is saved with this network{loaderData.studyUnreadable ? " that this version of Kilostep can read" : ""}. Run one on the{" "}
                <Link to={`/networks/${id}/ladder`}>Voltage ladder</Link> page and save it to include it here.
              </p>
            )}
          </section>

          <section className="ks-report-part" aria-labelledby="report-assumptions">
            <h2 id="report-assumptions">7. Assumptions and inputs</h2>
            <dl className="ks-report-facts ks-report-assumptions">
              <dt>System base</dt>
              <dd>
                {solved.network.baseMVA} MVA; each bus's voltage base is its nominal voltage; {solved.network.frequencyHz} Hz.
              </dd>
              <dt>Load flow</dt>
              <dd>
                {LOAD_FLOW_METHOD}; converged when the largest bus power mismatch is below {MISMATCH_TOLERANCE_PU.toExponential(0)} pu, at most{" "}
                {MAX_ITERATIONS} iterations. Lines as π models, transformers with their off-nominal tap ratio on the HV side and the core as a shunt
                at the HV terminal. Angles are given as if every transformer were Yy0: the vector group's phase shift changes no magnitude or flow
                in a radial network.
              </dd>
              <dt>Voltage bands</dt>
              <dd>Each bus's own band, as in the bus table (0.95–1.05 pu unless set otherwise).</dd>
              <dt>Fault levels</dt>
              <dd>
                IEC 60909-0 equivalent voltage source at the fault, c<sub>max</sub> 1.10 above 1 kV and 1.05 at or below; loads, line capacitance
                and magnetising branches left out; transformer correction K<sub>T</sub> and generator correction K<sub>G</sub>; peak current with κ
                = 1.02 + 0.98·e<sup>−3R/X</sup>; line-to-earth through the zero-sequence paths the vector groups allow (lines without zero-sequence
                data at 3 × their positive sequence). Compared with each bus's rated breaking current where given.
              </dd>
              <dt>Losses in money</dt>
              <dd>
                Energy lost a year = peak load-dependent loss × loss load factor × 8760 h + core loss × 8760 h; loss load factor k·LF + (1 − k)·LF²;
                present value over the study period at the discount rate, the load-dependent part growing with the square of the load growth; total
                cost = capital + present value of losses; the recommendation is the lowest total among alternatives that keep every voltage and
                loading within its limit.
              </dd>
              <dt>The 1/V² law</dt>
              <dd>
                For the same delivered power at the same power factor through the same resistance, P<sub>loss</sub> = P²R / (V² cos²φ): the
                section's line losses are shown beside this law, drawn through the lowest voltage that carries the load.
              </dd>
            </dl>
            <h3>Input data</h3>
            <p>
              Every element of revision {loaderData.revision.number} as solved, with the network file's defaults filled in; a dash is a value not given or one that
              does not apply.
            </p>
            <InputTables network={solved.network} />
          </section>
        </>
      )}

      <section className="ks-report-part ks-report-cautions" aria-labelledby="report-cautions">
        <h2 id="report-cautions">{solved ? "8. " : ""}Cautions</h2>
        <ul>
          <li>Results are for planning-stage screening only.</li>
          <li>Verify them against the applicable grid code, local regulations and the equipment makers' data.</li>
          <li>Protection settings and construction designs must be done and approved by licensed engineers.</li>
          <li>Fault levels by IEC 60909-0 are not a protection study.</li>
          <li>Unit costs used where no capital cost was entered are illustrative placeholders, not prices.</li>
        </ul>
      </section>
    </article>
  );
}
