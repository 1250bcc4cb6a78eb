// Checks: every limit the solved network breaks, or why it cannot be solved. Clicking an entry
// selects the element on the sheet.
import type { SheetIssue } from "./documentIssues.ts";
import { fixed } from "#app/lib/format.ts";
import { statusCue } from "#app/lib/limitStatus.ts";
import { readingNumber } from "#app/lib/format.ts";
import type { ShownCase } from "./caseView.ts";
import { useSheet, useSheetActions, type EnvelopeReadings } from "./sheetStore.ts";

function IssueList({ issues, lead }: { issues: SheetIssue[]; lead: string }) {
  const actions = useSheetActions();
  return (
    <>
      <p className="ks-panel-note">{lead}</p>
      <ul className="ks-check-list">
        {issues.map((issue, i) => (
          <li key={`${issue.elementId}-${i}`}>
            {issue.elementId ? (
              <button type="button" className="ks-check ks-check-issue" onClick={() => actions.focusElement(issue.elementId!)}>
                <span aria-hidden="true">✕</span> {issue.message}
              </button>
            ) : (
              <span className="ks-check ks-check-issue">
                <span aria-hidden="true">✕</span> {issue.message}
              </span>
            )}
          </li>
        ))}
      </ul>
    </>
  );
}

export function ChecksPanel() {
  const solve = useSheet((s) => s.solve);
  const actions = useSheetActions();

  let body;
  let summary: string;
  if (solve.kind === "pending") {
    summary = "Solving…";
    body = <p className="ks-panel-note">Solving the network…</p>;
  } else if (solve.kind === "failed") {
    summary = "Not solved";
    body = <p className="ks-check ks-check-issue">{solve.message}</p>;
  } else if (solve.kind === "invalid") {
    summary = `Not solved: ${solve.issues.length} ${solve.issues.length === 1 ? "thing" : "things"} to fix`;
    body = <IssueList issues={solve.issues} lead="The drawing is not a complete network yet, so there are no readings:" />;
  } else if (solve.kind === "envelope") {
    ({ summary, body } = envelopeChecks(solve.envelope, actions.focusElement));
  } else {
    const { result, elapsedMs, problems, leftOut, shownCase } = solve.readings;
    const converged = result.loadFlow.converged;
    const limitChecks = result.checks.filter((c) => c.kind !== "not-converged");
    summary = !converged
      ? "Load flow did not converge"
      : limitChecks.length
        ? `${limitChecks.length} ${limitChecks.length === 1 ? "limit" : "limits"} broken`
        : "Every limit kept";
    if (shownCase) summary = `${summary} in “${shownCase.name}”`;
    if (problems.length) summary = `${summary} · ${problems.length} ${problems.length === 1 ? "thing" : "things"} to finish`;
    body = (
      <>
        {shownCase ? <CaseNote shownCase={shownCase} /> : null}
        {problems.length ? (
          <IssueList
            issues={problems}
            lead={`Not finished yet: ${leftOut.size} ${leftOut.size === 1 ? "element is" : "elements are"} left out of the solution (marked on the sheet); the rest is solved.`}
          />
        ) : null}
        {!converged ? (
          <p className="ks-check ks-check-issue" role="alert">
            <span aria-hidden="true">✕ </span>
            {result.loadFlow.message ?? "The load flow did not converge."}
          </p>
        ) : null}
        {converged && limitChecks.length === 0 ? (
          <p className={`ks-check ${statusCue.within.className}`}>
            <span aria-hidden="true">{statusCue.within.icon} </span>
            No bus voltage, line current, transformer loading or fault current is beyond its limit.
          </p>
        ) : null}
        {limitChecks.length ? (
          <ul className="ks-check-list">
            {limitChecks.map((check, i) => (
              <li key={`${check.element}-${check.kind}-${i}`}>
                <button type="button" className="ks-check ks-check-issue" onClick={() => actions.focusElement(check.element)}>
                  <span aria-hidden="true">{statusCue.beyond.icon}</span> {check.message}
                </button>
              </li>
            ))}
          </ul>
        ) : null}
        {converged ? (
          <p className="ks-panel-foot">
            Solved in the browser in {fixed(elapsedMs, 1)} ms, {result.loadFlow.iterations} iterations.
          </p>
        ) : null}
      </>
    );
  }

  return (
    <section className="ks-panel ks-checks" aria-labelledby="ks-checks-title">
      <header className="ks-panel-head">
        <h2 id="ks-checks-title">Checks</h2>
        <p className="ks-panel-sub" aria-live="polite">
          {summary}
        </p>
      </header>
      <div className="ks-panel-body">{body}</div>
    </section>
  );
}

function CaseNote({ shownCase }: { shownCase: ShownCase }) {
  const out = shownCase.outOfService.size;
  return (
    <p className="ks-panel-note">
      Operating case “{shownCase.name}”
      {out ? `: ${out} ${out === 1 ? "element is" : "elements are"} out of service or without supply (marked on the sheet)` : ""}
      {shownCase.lostLoadMW > 0 ? `, ${readingNumber(shownCase.lostLoadMW, "MW")} MW of load without supply` : ""}.
    </p>
  );
}

/** Every limit any case breaks, each named with its case, as the study page lists them. */
function envelopeChecks(envelope: EnvelopeReadings, focus: (id: string) => void) {
  const cases = envelope.study.cases;
  const notConverged = cases.filter((c) => !c.loadFlow.converged);
  const broken = cases.flatMap((c) => c.checks.filter((check) => check.kind !== "not-converged").map((check) => ({ check, caseName: c.name })));
  const casesBreaking = new Set(broken.map((b) => b.caseName)).size;
  let summary = broken.length
    ? `${broken.length} ${broken.length === 1 ? "limit" : "limits"} broken in ${casesBreaking} of ${cases.length} cases`
    : `Every limit kept in all ${cases.length} cases`;
  if (notConverged.length) summary = `${summary} · ${notConverged.length} not converged`;
  const body = (
    <>
      <p className="ks-panel-note">Envelope of the operating cases: voltages and loadings, no fault levels.</p>
      {notConverged.map((c) => (
        <p key={c.id} className="ks-check ks-check-issue" role="alert">
          <span aria-hidden="true">✕ </span>
          {c.name}: {c.loadFlow.message ?? "the load flow did not converge."}
        </p>
      ))}
      {broken.length ? (
        <ul className="ks-check-list">
          {broken.map(({ check, caseName }, i) => (
            <li key={`${check.case}-${check.element}-${check.kind}-${i}`}>
              <button type="button" className="ks-check ks-check-issue" onClick={() => focus(check.element)}>
                <span aria-hidden="true">{statusCue.beyond.icon}</span> <strong>{caseName}</strong>: {check.message}
              </button>
            </li>
          ))}
        </ul>
      ) : notConverged.length === 0 ? (
        <p className={`ks-check ${statusCue.within.className}`}>
          <span aria-hidden="true">{statusCue.within.icon} </span>
          No bus voltage, line current or transformer loading is beyond its limit in any case.
        </p>
      ) : null}
      <p className="ks-panel-foot">
        {cases.length} cases solved in the browser in {fixed(envelope.elapsedMs, 1)} ms.
      </p>
    </>
  );
  return { summary, body };
}
