import { useEffect, useMemo, useRef, useState } from "react";
import { data, Link, useFetcher, useLoaderData, useRevalidator, type ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/ladder";
import { AlternativeInputs } from "#app/components/ladder/AlternativeInputs.tsx";
import { CostPlot } from "#app/components/ladder/CostPlot.tsx";
import { LadderComparison, SensitivityTable } from "#app/components/ladder/LadderTables.tsx";
import { kvText } from "#app/lib/format.ts";
import { LossPlot } from "#app/components/ladder/LossPlot.tsx";
import { MoneyInputs, UnitCostNote } from "#app/components/ladder/MoneyInputs.tsx";
import { defaultProfileEnd, ProfilePlot } from "#app/components/ladder/ProfilePlot.tsx";
import { SectionPicker } from "#app/components/ladder/SectionPicker.tsx";
import {
  canonicalRequest,
  defaultSectionBus,
  draftForSection,
  draftFromRequest,
  errorsByPath,
  moneyOfDraft,
  moveToSection,
  requestFromDraft,
  toggleVoltage,
  voltageKey,
  emptyAlternative,
  type FieldErrors,
  type StudyDraft,
} from "#app/components/ladder/studyDraft.ts";
import { VoltageChips } from "#app/components/ladder/VoltageChips.tsx";
import { chainEnds } from "#solver/topology.ts";
import { Notice } from "#app/components/Notice.tsx";
import { FormField } from "#app/components/FormField.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { computeRefusal, computeRefusalOf, savedLadderOf } from "#app/lib/compute/results.server.ts";
import type { JobView } from "#app/lib/compute/jobView.ts";
import { refusedRequestSentence } from "#app/lib/api.server.ts";
import { savedLadderStudy, startLadderJob, type LadderJobResult } from "#app/lib/ladder.server.ts";
import { JobStatus } from "#app/components/jobs/JobStatus.tsx";
import { useJob } from "#app/components/jobs/useJob.ts";
import { currentDocument, checkedRevision } from "#app/lib/networks.server.ts";
import { networkAccess, roleAllows } from "#app/lib/permissions.server.ts";
import { candidateVoltagesKV } from "#solver/iec60038.ts";
import { checkLadderRequest, findSection, type Ladder } from "#solver/ladder.ts";
import "#app/components/report/drawing.css";
import "#app/components/ladder/ladder.css";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Voltage ladder · ${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, role, actor } = await requireNetwork(request, params, "view");
  const [revision, saved] = await Promise.all([currentDocument(db, network), savedLadderStudy(db, network.id)]);
  const checked = checkedRevision(network, revision);
  // The saved study is run again on the current revision, so what the page shows is never stale.
  const savedRun =
    saved.study && checked.ok
      ? await savedLadderOf(db, network, saved.study, actor).catch((failure) => computeRefusal(failure, "page"))
      : null;
  return {
    id: network.id,
    name: network.name,
    role,
    canSave: roleAllows(role, "edit"),
    revision: network.current_revision,
    document: checked.ok ? checked.network : null,
    documentIssues: checked.ok ? [] : checked.issues,
    saved: saved.study,
    savedUnreadable: saved.unreadable,
    savedLadder: savedRun?.ok ? savedRun.ladder : null,
    savedIssues: savedRun && !savedRun.ok ? savedRun.issues : [],
  };
}

type ActionAnswer =
  | { ok: true; intent: "run" | "save"; job: JobView<LadderJobResult>; request: unknown }
  | { ok: false; intent: "run" | "save"; error: string; issues: { path: string; message: string }[] };

/**
 * JSON `{ intent: "run" | "save", request, basedOn }`: run the ladder (anyone who may view), or run
 * and save it (editors). A request that is wrong in itself is answered at once (400, fields named);
 * otherwise the ladder starts as a job (202 with the job) that the page follows at
 * /networks/:id/jobs/:jobId, shows the progress of, and may cancel.
 */
export async function action({ request, params }: Route.ActionArgs) {
  const { db, user, actor, network } = await requireNetwork(request, params, "view");
  const answer = (body: ActionAnswer, status = 200) => data(body, { status });
  let body: { intent?: unknown; request?: unknown; basedOn?: unknown };
  try {
    body = (await request.json()) as typeof body;
  } catch {
    return answer({ ok: false, intent: "run", error: "The page sent something that is not JSON; reload it and try again.", issues: [] }, 400);
  }
  const intent = body.intent === "save" ? "save" : "run";
  // Anyone who may view may run the ladder; saving it as the network's study also needs edit,
  // refused in the page's own answer so the form can say why.
  if (intent === "save") {
    const editing = await networkAccess(db, actor, network.id, "edit");
    if (!editing.ok) return answer({ ok: false, intent, error: editing.error, issues: [] }, editing.status);
  }
  const checkedRequest = checkLadderRequest(body.request);
  if (!checkedRequest.ok) return answer({ ok: false, intent, error: refusedRequestSentence("ladder", checkedRequest.issues), issues: checkedRequest.issues }, 400);
  const basedOn = typeof body.basedOn === "string" ? body.basedOn : null;
  try {
    const job = await startLadderJob(db, network, actor, body.request, intent === "save" ? { userId: user.id, basedOn } : null);
    return answer({ ok: true, intent, job, request: body.request }, 202);
  } catch (failure) {
    const refused = computeRefusalOf(failure);
    return answer({ ok: false, intent, error: refused.error, issues: [] }, refused.status);
  }
}

/**
 * Starting a job changes nothing stored yet, so the page's data is not read again then; a saving
 * job asks for it itself once it has saved (LadderStudy).
 */
export function shouldRevalidate({ actionResult, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (actionResult && typeof actionResult === "object" && "intent" in actionResult) return false;
  return defaultShouldRevalidate;
}

export default function LadderPage({ loaderData }: Route.ComponentProps) {
  const { id, name, document } = loaderData;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/networks/${id}`}>← {name}</Link>
      </p>
      <PageTitle
        title="Voltage ladder"
        lead={
          <>
            {name} · revision {loaderData.revision} · your role <span className="role-badge">{loaderData.role}</span>
          </>
        }
        actions={
          <>
            <Link to={`/networks/${id}/study`} className="btn">
              Study
            </Link>
            <Link to={`/networks/${id}/report`} className="btn">
              Study report
            </Link>
          </>
        }
      />
      {document ? (
        <LadderStudy key={loaderData.revision} />
      ) : (
        <Notice tone="error">
          This revision no longer passes the network file's checks, so the ladder cannot run. Fix the network first:
          <ul className="mt-2 list-disc pl-5">
            {loaderData.documentIssues.map((issue) => (
              <li key={`${issue.path}-${issue.message}`}>
                <code>{issue.path || "document"}</code>: {issue.message}
              </li>
            ))}
          </ul>
        </Notice>
      )}
    </>
  );
}

function initialDraft(loaderData: Route.ComponentProps["loaderData"]): StudyDraft {
  const network = loaderData.document!;
  if (loaderData.saved) return draftFromRequest(network, loaderData.saved.request);
  return draftForSection(network, defaultSectionBus(network));
}

function LadderStudy() {
  const loaderData = useLoaderData<typeof loader>();
  const network = loaderData.document!;
  const fetcher = useFetcher<typeof action>();
  const [draft, setDraft] = useState<StudyDraft>(() => initialDraft(loaderData));
  const [clientErrors, setClientErrors] = useState<FieldErrors>({});
  const [profileEnd, setProfileEnd] = useState<string>();
  const errorSummary = useRef<HTMLDivElement>(null);

  const section = findSection(network, draft.sectionBus);
  const offeredKV = section ? candidateVoltagesKV(section.nominalKV, { frequencyHz: network.frequencyHz }) : [];
  const money = useMemo(() => moneyOfDraft(draft, network), [draft, network]);
  const draftCanonical = useMemo(() => canonicalRequest(requestFromDraft(draft, network).request), [draft, network]);

  const answer = fetcher.data;
  const { job, cancel, cancelling } = useJob(answer?.ok === true ? answer.job : null);
  const revalidator = useRevalidator();
  const running = fetcher.state !== "idle" || job?.state === "running";
  const runningIntent = fetcher.state !== "idle" ? (fetcher.json as { intent?: string } | undefined)?.intent : job?.state === "running" ? answer?.intent : undefined;
  const finished = answer?.ok === true && job?.state === "done" && job.result ? { ladder: job.result.ladder, request: answer.request } : null;
  const shown: { ladder: Ladder; request: unknown } | null =
    finished ?? (loaderData.savedLadder ? { ladder: loaderData.savedLadder, request: loaderData.saved?.request } : null);
  // A refusal: the page's own answer, or the job's when it failed, was cancelled or stopped.
  const failure: { error: string; issues: { path: string; message: string }[] } | null =
    answer && !answer.ok ? answer : job && job.state !== "running" && job.state !== "done" ? { error: job.error ?? "The ladder did not finish.", issues: job.issues } : null;
  const serverErrors = failure ? errorsByPath(failure.issues) : {};
  const errors = { ...serverErrors, ...clientErrors };
  const stale = shown !== null && canonicalRequest(shown.request) !== draftCanonical;
  const savedCanonical = loaderData.saved ? canonicalRequest(loaderData.saved.request) : undefined;
  const unsaved = savedCanonical !== draftCanonical;

  useEffect(() => {
    if (failure) errorSummary.current?.focus();
  }, [failure?.error]);

  // Once a saving job has saved, the page's data (who saved, when) is read again.
  const savedJob = job?.state === "done" && job.result?.saved ? job.id : null;
  useEffect(() => {
    if (savedJob) revalidator.revalidate();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [savedJob]);

  const submit = (intent: "run" | "save") => {
    const { request, errors: found } = requestFromDraft(draft, network);
    setClientErrors(found);
    if (Object.keys(found).length > 0) {
      requestAnimationFrame(() => errorSummary.current?.focus());
      return;
    }
    // The saved study this page started from: saving over a newer one answers 409 instead.
    fetcher.submit({ intent, request, basedOn: loaderData.saved?.updatedAt ?? null } as never, { method: "post", encType: "application/json" });
  };

  const update = (next: StudyDraft) => {
    setDraft(next);
    setClientErrors({});
  };

  const errorList = Object.entries(errors);
  const ends = chainEnds(network);
  const endBusId = shown ? (profileEnd && ends.includes(profileEnd) ? profileEnd : defaultProfileEnd(shown.ladder, network)) : undefined;

  return (
    <div className="ks-ladder">
      {loaderData.savedUnreadable ? (
        <Notice tone="info">The study saved with this network no longer reads with this version of Kilostep; the form starts afresh.</Notice>
      ) : null}
      {loaderData.savedIssues.length > 0 ? (
        <Notice tone="info">
          The saved study does not run on revision {loaderData.revision}: {loaderData.savedIssues.map((i) => `${i.path ? `${i.path} ` : ""}${i.message}`).join("; ")}.
          Adjust it below.
        </Notice>
      ) : null}

      <section aria-labelledby="ladder-section" className="panel ks-step">
        <h2 id="ladder-section" className="ks-step-title">
          <span className="ks-step-number" aria-hidden="true">
            1
          </span>
          Section to re-rate
        </h2>
        <SectionPicker
          network={network}
          sectionBus={draft.sectionBus}
          section={section}
          error={errors.sectionBus}
          onPick={(busId) => update(moveToSection(draft, network, busId))}
        />
      </section>

      <section aria-labelledby="ladder-voltages" className="panel ks-step">
        <h2 id="ladder-voltages" className="ks-step-title">
          <span className="ks-step-number" aria-hidden="true">
            2
          </span>
          Candidate voltages
        </h2>
        <VoltageChips
          offeredKV={offeredKV}
          presentKV={section?.nominalKV}
          selectedKV={draft.voltagesKV}
          onToggle={(kv) => update(toggleVoltage(draft, kv))}
          onAdd={(kv) => update(toggleVoltage(draft, kv))}
          error={voltageErrors(errors)}
        />
      </section>

      {section ? (
        <section aria-labelledby="ladder-alternatives" className="panel ks-step">
          <h2 id="ladder-alternatives" className="ks-step-title">
            <span className="ks-step-number" aria-hidden="true">
              3
            </span>
            Each alternative
          </h2>
          <p className="field-hint ks-step-lead">
            Every alternative re-rates the section's buses and the windings facing it. Change the conductor, the taps or the capital cost
            where an alternative needs it; an empty field keeps the drawn value or the estimate shown.
          </p>
          <SizingOption draft={draft} error={errors["sizing.clearingTimeS"]} onChange={(sizing) => update({ ...draft, sizing })} />
          <AlternativeInputs
            network={network}
            section={section}
            draft={draft}
            money={money}
            errors={errors}
            onChange={(kv, patch) =>
              update({
                ...draft,
                alternatives: { ...draft.alternatives, [voltageKey(kv)]: { ...(draft.alternatives[voltageKey(kv)] ?? emptyAlternative()), ...patch } },
              })
            }
          />
        </section>
      ) : null}

      <section aria-labelledby="ladder-money" className="panel ks-step">
        <h2 id="ladder-money" className="ks-step-title">
          <span className="ks-step-number" aria-hidden="true">
            4
          </span>
          Money
        </h2>
        <MoneyInputs draft={draft.money} parsed={money} errors={errors} onChange={(patch) => update({ ...draft, money: { ...draft.money, ...patch } })} />
        {money ? <UnitCostNote money={money} /> : null}
      </section>

      <section aria-labelledby="ladder-cases" className="panel ks-step">
        <h2 id="ladder-cases" className="ks-step-title">
          <span className="ks-step-number" aria-hidden="true">
            5
          </span>
          Judged across
        </h2>
        <p className="field-hint ks-step-lead">
          {network.cases && network.cases.length > 0
            ? `Every alternative is solved in each of the network's ${network.cases.length} operating cases (${network.cases.map((c) => c.name).join(", ")}) and qualifies only if it keeps every limit in all of them; losses are summed over the cases' hours.`
            : "The network has no operating cases, so each alternative is judged as drawn. Add cases on the Operating cases page to judge across them."}
        </p>
        <label className="flex items-baseline gap-2">
          <input type="checkbox" checked={draft.outages} onChange={(event) => update({ ...draft, outages: event.target.checked })} /> Require N-1: an
          alternative must also keep every limit with any one line or transformer out, in every case
        </label>
      </section>

      <div className="ks-run-bar">
        <button type="button" className="btn btn-primary" onClick={() => submit("run")} disabled={running}>
          {runningIntent === "run" ? "Running…" : "Run the ladder"}
        </button>
        {loaderData.canSave ? (
          <button type="button" className="btn" onClick={() => submit("save")} disabled={running}>
            {runningIntent === "save" ? "Saving…" : "Save the study"}
          </button>
        ) : null}
        <p className="ks-run-status" role="status">
          {savedStatus(loaderData, unsaved)}
        </p>
      </div>

      {job ? <JobStatus job={job} cancelling={cancelling} onCancel={cancel} what="ladder" /> : null}

      {errorList.length > 0 ? (
        <div ref={errorSummary} tabIndex={-1} className="notice notice-error ks-error-summary" role="alert">
          <p className="font-semibold">{failure ? failure.error : "Some inputs need a look before the ladder can run:"}</p>
          <ul>
            {errorList.map(([path, message]) => (
              <li key={path}>
                {path ? <code>{path}</code> : null} {message}
              </li>
            ))}
          </ul>
        </div>
      ) : failure ? (
        <div ref={errorSummary} tabIndex={-1}>
          <Notice tone={job?.state === "cancelled" ? "info" : "error"}>{failure.error}</Notice>
        </div>
      ) : null}

      {shown ? (
        <section aria-labelledby="ladder-results" className="ks-results" aria-busy={running}>
          <h2 id="ladder-results" className="ks-results-title">
            Alternatives side by side
          </h2>
          {stale ? (
            <Notice tone="info">These results are for the inputs as last run; run the ladder again to bring them up to date.</Notice>
          ) : null}
          <Recommendation ladder={shown.ladder} />
          <LadderComparison ladder={shown.ladder} network={network} />
          <SensitivityTable ladder={shown.ladder} />
          <div className="ks-plot-grid">
            <div className="panel ks-plot-panel">
              <LossPlot ladder={shown.ladder} />
            </div>
            <div className="panel ks-plot-panel">
              <CostPlot ladder={shown.ladder} />
            </div>
            <div className="panel ks-plot-panel ks-plot-wide">
              <ProfilePlot ladder={shown.ladder} network={network} endBusId={endBusId} />
              {ends.length > 1 ? (
                <ProfileEndPicker ends={ends} network={network} value={endBusId} onChange={setProfileEnd} />
              ) : null}
            </div>
          </div>
        </section>
      ) : null}
    </div>
  );
}

/** Size the section's conductor for every alternative: the library type passing current, voltage and fault withstand at least lifetime cost. */
function SizingOption({ draft, error, onChange }: { draft: StudyDraft; error: string | undefined; onChange: (sizing: StudyDraft["sizing"]) => void }) {
  return (
    <fieldset className="ks-ladder-sizing">
      <legend className="sr-only">Conductor sizing</legend>
      <label className="flex items-baseline gap-2">
        <input type="checkbox" checked={draft.sizing.on} onChange={(event) => onChange({ ...draft.sizing, on: event.target.checked })} /> Size the
        section's conductor for each voltage: the library type of its construction that carries the load, keeps every bus beyond it in its
        band and withstands the fault (S ≥ I·√t / k), at least lifetime cost. An alternative given its own conductor below keeps it.
      </label>
      {draft.sizing.on ? (
        <FormField
          className="ks-ladder-sizing-time"
          label="Fault clearing time, s"
          name="sizingClearingTimeS"
          inputMode="decimal"
          hint="How long the protection takes to clear a fault on the section; the adiabatic withstand uses it."
          value={draft.sizing.clearingTimeS}
          error={error}
          onChange={(event) => onChange({ ...draft.sizing, clearingTimeS: event.target.value })}
        />
      ) : null}
    </fieldset>
  );
}

function voltageErrors(errors: FieldErrors): string | undefined {
  const messages = Object.entries(errors)
    .filter(([path]) => path === "voltagesKV" || path.startsWith("voltagesKV["))
    .map(([, message]) => message);
  return messages.length > 0 ? messages.join(" ") : undefined;
}

function savedStatus(loaderData: Route.ComponentProps["loaderData"], unsaved: boolean): string {
  const saved = loaderData.saved;
  const who = saved ? `saved by ${saved.updatedByName ?? "a former member"}, ${formatDateTime(saved.updatedAt)}, on revision ${saved.networkRevision}` : "";
  if (!loaderData.canSave)
    return saved ? `Showing the study ${who}. Your role may run the ladder; saving needs an editor.` : "Your role may run the ladder; saving needs an editor.";
  if (!saved) return "No study is saved with this network yet.";
  return unsaved ? `Changed since the study was ${who}.` : `The study as ${who}.`;
}

function Recommendation({ ladder }: { ladder: Ladder }) {
  if (!ladder.cheapest) return <Notice tone="error">No alternative carries the load, so there is nothing to recommend. Try a higher voltage or a heavier conductor.</Notice>;
  return (
    <div className={`notice ${ladder.cheapest.withinLimits ? "notice-ok" : "notice-info"} ks-recommendation`} role="status">
      <p className="font-semibold">
        <span aria-hidden="true">★ </span>
        Recommended: {kvText(ladder.cheapest.voltageKV)}
      </p>
      <p>{ladder.cheapest.note}</p>
      {ladder.cheapest.decidingCase ? (
        <p>
          Decided by the case <strong>{ladder.cheapest.decidingCase.name}</strong>
          {ladder.cheapest.decidingCase.reason === "limits" ? ": a cheaper alternative breaks a limit there." : ": its losses weigh most in the year's energy."}
        </p>
      ) : null}
    </div>
  );
}

function ProfileEndPicker({
  ends,
  network,
  value,
  onChange,
}: {
  ends: string[];
  network: NonNullable<Route.ComponentProps["loaderData"]["document"]>;
  value: string | undefined;
  onChange: (busId: string) => void;
}) {
  return (
    <div className="ks-profile-end">
      <label htmlFor="ladder-profile-end" className="field-label">
        Profile to
      </label>
      <select id="ladder-profile-end" className="input" value={value} onChange={(event) => onChange(event.target.value)}>
        {ends.map((busId) => (
          <option key={busId} value={busId}>
            {network.buses.find((b) => b.id === busId)?.name ?? busId}
          </option>
        ))}
      </select>
    </div>
  );
}
