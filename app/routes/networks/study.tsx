// /networks/:networkId/study (and /s/:token/study for a view link): the study of the saved
// revision. Every operating case, with N-1 and the years of load growth when asked (?outages=on,
// ?years=on, ?rate=, ?horizon=), run on the server while the page shows its progress; then the
// case × element table, the envelope, the limits broken by case, N-1 with firm capacity, the years
// and the energy lost, each table downloadable as CSV.
import { data, Form, Link } from "react-router";
import type { Route } from "./+types/study";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { StudyRunner } from "#app/components/study/StudyRunner.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { networkReader } from "#app/lib/networkReader.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { parseStudyOptions, studyQuery } from "#app/lib/studyOptions.ts";
import { operatingCases } from "#solver/study/applyCase.ts";
import { validateNetwork } from "#solver/schema.ts";
import "#app/components/report/report.css";
import "#app/components/study/study.css";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Study · ${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  const { network, role, home, viaLink } = await networkReader(db, request, params);
  const parsed = parseStudyOptions(new URL(request.url).searchParams);
  const { document } = await currentDocument(db, network);
  const checked = validateNetwork(document);
  const cases = checked.ok ? operatingCases(checked.network) : [];
  const branchCount = checked.ok ? checked.network.lines.length + checked.network.transformers.length : 0;
  const page = {
    id: network.id,
    name: network.name,
    home,
    viaLink,
    role,
    revision: network.current_revision,
    mayEditCases: !viaLink && roleAllows(role, "edit"),
    options: parsed.options,
    optionErrors: parsed.ok ? {} : parsed.errors,
    documentIssues: checked.ok ? [] : checked.issues.slice(0, 100),
    cases: cases.map((c) => ({ id: c.id, name: c.name, hoursPerYear: c.hoursPerYear ?? null })),
    growth: checked.ok ? (checked.network.growth ?? null) : null,
    branchCount,
  };
  // A query the study cannot run is the page with the form's messages, answered as a bad request.
  return data(page, { status: parsed.ok ? 200 : 400 });
}

export default function StudyPage({ loaderData }: Route.ComponentProps) {
  const { id, name, home, viaLink, options, optionErrors, cases, growth, branchCount, documentIssues } = loaderData;
  const query = studyQuery(options);
  const hasErrors = Object.keys(optionErrors).length > 0;
  const horizon = options.years ? Number(options.horizon || growth?.years || 0) : 0;
  const expected = cases.length + (options.outages ? cases.length * branchCount : 0) + (Number.isFinite(horizon) ? horizon * cases.length : 0);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={home}>← {name}</Link>
      </p>
      <PageTitle
        title="Study"
        lead={
          <>
            {name} · revision {loaderData.revision}
            {viaLink ? " · shared with you to read" : ""}
          </>
        }
        actions={
          <>
            {loaderData.mayEditCases ? (
              <Link to={`/networks/${id}/cases`} className="btn btn-small">
                Edit operating cases
              </Link>
            ) : null}
            {viaLink ? null : (
              <Link to={`/networks/${id}/ladder`} className="btn btn-small">
                Voltage ladder
              </Link>
            )}
            <Link to={`${home}/report`} className="btn btn-small">
              Study report
            </Link>
          </>
        }
      />

      {documentIssues.length > 0 ? (
        <Notice tone="error">
          Revision {loaderData.revision} no longer passes the network file's checks, so it cannot be studied. Fix the network first:
          <ul className="mt-2 list-disc pl-5">
            {documentIssues.map((issue) => (
              <li key={`${issue.path}-${issue.message}`}>
                <code>{issue.path || "document"}</code>: {issue.message}
              </li>
            ))}
          </ul>
        </Notice>
      ) : (
        <>
          <section className="panel p-5 ks-study-form" aria-labelledby="study-what">
            <h2 id="study-what" className="text-lg">
              What to study
            </h2>
            <p className="field-hint">
              {cases.length === 1 && cases[0].id === "as-drawn"
                ? "The network has no operating cases, so it is studied as drawn."
                : `${cases.length} operating cases: ${cases.map((c) => `${c.name}${c.hoursPerYear === null ? "" : ` (${c.hoursPerYear.toLocaleString("en-GB")} h)`}`).join(", ")}.`}
            </p>
            <Form method="get" className="ks-study-options">
              <label className="ks-check">
                <input type="checkbox" name="outages" defaultChecked={options.outages} aria-describedby={optionErrors.outages ? "study-outages-error" : undefined} />{" "}
                Outages (N-1): each line and transformer out in turn, in every case ({branchCount.toLocaleString("en-GB")} elements)
              </label>
              {optionErrors.outages ? (
                <p id="study-outages-error" className="field-error">
                  {optionErrors.outages}
                </p>
              ) : null}
              <fieldset className="ks-study-years">
                <label className="ks-check">
                  <input type="checkbox" name="years" defaultChecked={options.years} aria-describedby={optionErrors.years ? "study-years-error" : undefined} /> Years of
                  load growth
                  {growth ? ` (the network's own: ${growth.ratePctPerYear} % a year over ${growth.years} years)` : " (the network gives no growth: enter it here)"}
                </label>
                {optionErrors.years ? (
                  <p id="study-years-error" className="field-error">
                    {optionErrors.years}
                  </p>
                ) : null}
                <div className="ks-study-growth">
                  <label>
                    <span className="field-label">Growth rate</span>
                    <span className="flex items-center gap-1">
                      <input
                        className="input w-24"
                        name="rate"
                        inputMode="decimal"
                        defaultValue={options.rate}
                        placeholder={growth ? String(growth.ratePctPerYear) : ""}
                        aria-invalid={optionErrors.rate ? true : undefined}
                        aria-describedby={optionErrors.rate ? "study-rate-error" : undefined}
                      />
                      % a year
                    </span>
                    {optionErrors.rate ? (
                      <span id="study-rate-error" className="field-error">
                        {optionErrors.rate}
                      </span>
                    ) : null}
                  </label>
                  <label>
                    <span className="field-label">Horizon</span>
                    <span className="flex items-center gap-1">
                      <input
                        className="input w-24"
                        name="horizon"
                        inputMode="numeric"
                        defaultValue={options.horizon}
                        placeholder={growth ? String(growth.years) : ""}
                        aria-invalid={optionErrors.horizon ? true : undefined}
                        aria-describedby={optionErrors.horizon ? "study-horizon-error" : undefined}
                      />
                      years
                    </span>
                    {optionErrors.horizon ? (
                      <span id="study-horizon-error" className="field-error">
                        {optionErrors.horizon}
                      </span>
                    ) : null}
                  </label>
                </div>
              </fieldset>
              <button type="submit" className="btn btn-primary">
                Run the study
              </button>
            </Form>
          </section>

          {hasErrors ? (
            <Notice tone="error">The study did not run: {Object.values(optionErrors).join(" ")}</Notice>
          ) : (
            <StudyRunner key={query} url={`${home}/study/run${query}`} csvBase={`${home}/study.csv`} query={query} expectedLoadFlows={expected} />
          )}
        </>
      )}
    </>
  );
}
