// /networks/:networkId/cases — the network's operating cases and load growth. Anyone who may read
// the network sees them; editors add, change and remove cases (load scale, per-load factors, each
// source's dispatch or outage, elements out of service, hours a year) and set the growth. Every
// change is a new revision through the one save (validated, refused when someone saved meanwhile).
import { data, Form, Link, redirect, useActionData, useNavigation } from "react-router";
import type { Route } from "./+types/cases";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import {
  caseFields,
  caseFromFields,
  growthFromForm,
  readCaseFields,
  switchableElements,
  withCase,
  withoutCase,
  type CaseFields,
  type FieldErrors,
} from "#app/lib/caseForm.ts";
import { currentDocument, saveNetworkDocument } from "#app/lib/networks.server.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import "#app/components/study/study.css";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Operating cases · ${data?.name ?? "Network"} · Kilostep` }];

async function networkDocument(db: Parameters<typeof currentDocument>[0], network: Parameters<typeof currentDocument>[1]) {
  const checked = validateNetwork((await currentDocument(db, network)).document);
  if (!checked.ok)
    throw data(`Revision ${network.current_revision} no longer passes the network file's checks; fix it on the sheet before editing its cases.`, { status: 409 });
  return checked.network;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, role } = await requireNetwork(request, params, "view");
  const document = await networkDocument(db, network);
  const search = new URL(request.url).searchParams;
  const picked = search.get("case");
  const canEdit = roleAllows(role, "edit");
  const editing = !canEdit || picked === null ? null : picked === "new" ? caseFields(document, null) : (document.cases ?? []).some((c) => c.id === picked) ? caseFields(document, document.cases!.find((c) => c.id === picked)!) : null;
  return {
    id: network.id,
    name: network.name,
    role,
    canEdit,
    revision: network.current_revision,
    cases: document.cases ?? [],
    growth: document.growth ?? null,
    loads: document.loads.map((l) => ({ id: l.id, name: l.name, pMW: l.pMW, qMvar: l.qMvar })),
    sources: document.sources.map((s) => ({ id: s.id, name: s.name, kind: s.kind, control: s.control, pMW: s.pMW ?? null, qMvar: s.qMvar ?? null, voltagePu: s.voltagePu ?? null })),
    switchable: switchableElements(document),
    editing,
    unknownCase: canEdit && picked !== null && picked !== "new" && editing === null ? picked : null,
    done: search.get("done"),
  };
}

type ActionAnswer =
  | { intent: "save"; fields: CaseFields; errors: FieldErrors; message: string }
  | { intent: "growth"; errors: FieldErrors; message: string; values: { ratePctPerYear: string; years: string } }
  | { intent: "delete"; errors: FieldErrors; message: string };

const refuse = (answer: ActionAnswer, status: number) => data(answer, { status });

/** Paths the network file's rules name (cases[i].hoursPerYear) turned into the form's fields. */
function fieldOf(path: string): string {
  const m = /^cases(?:\[\d+\])?\.?(\w+)?(?:\.([\w.-]+))?/.exec(path);
  if (!m) return "form";
  if (m[1] === "loads" && m[2]) return `load.${m[2]}`;
  if (m[1] === "sources" && m[2]) return `source.${m[2]}.mode`;
  return m[1] === "outOfService" ? "out" : (m[1] ?? "hoursPerYear");
}

export async function action({ request, params }: Route.ActionArgs) {
  const { db, user, network } = await requireNetwork(request, params, "edit");
  const form = await request.formData();
  const document = await networkDocument(db, network);
  const intent = String(form.get("intent") ?? "");
  const expected = parseId(String(form.get("revision") ?? ""));
  const stale = `Someone saved the network since this page was opened (it is now at revision ${network.current_revision}). Nothing was saved; reload the page and make the change again.`;

  let next: Network;
  let message: string;
  let answer: ActionAnswer;
  if (intent === "save") {
    const fields = readCaseFields(form, document);
    if (fields.originalId !== "" && !(document.cases ?? []).some((c) => c.id === fields.originalId))
      return refuse({ intent, fields, errors: {}, message: `There is no case “${fields.originalId}” any more; someone may have removed it. Reload the page.` }, 404);
    const made = caseFromFields(fields, document);
    if (!made.ok) return refuse({ intent, fields, errors: made.errors, message: "The case was not saved: some fields need a look." }, 400);
    next = withCase(document, made.operatingCase, fields.originalId);
    message = `Operating case “${made.operatingCase.name}” ${fields.originalId === "" ? "added" : "changed"}`;
    answer = { intent, fields, errors: {}, message: "" };
  } else if (intent === "delete") {
    const caseId = String(form.get("caseId") ?? "");
    const gone = (document.cases ?? []).find((c) => c.id === caseId);
    if (!gone) return refuse({ intent, errors: {}, message: `There is no case “${caseId.slice(0, 100)}” to remove.` }, 404);
    next = withoutCase(document, caseId);
    message = `Operating case “${gone.name}” removed`;
    answer = { intent, errors: {}, message: "" };
  } else if (intent === "growth") {
    const values = { ratePctPerYear: String(form.get("ratePctPerYear") ?? "").slice(0, 40), years: String(form.get("years") ?? "").slice(0, 40) };
    const read = growthFromForm(form);
    if (!read.ok) return refuse({ intent, values, errors: read.errors, message: "The growth was not saved: some fields need a look." }, 400);
    const { growth: _old, ...rest } = document;
    next = read.growth ? { ...rest, version: 2, growth: read.growth } : rest;
    message = read.growth ? `Load growth set to ${read.growth.ratePctPerYear} % a year over ${read.growth.years} years` : "Load growth removed";
    answer = { intent, values, errors: {}, message: "" };
  } else {
    return refuse({ intent: "delete", errors: {}, message: "The form did not say what to do (save, delete or growth). Reload the page and try again." }, 400);
  }

  if (expected !== network.current_revision) return refuse({ ...answer, message: stale }, 409);
  const saved = await saveNetworkDocument(db, { networkId: network.id, expectedRevision: network.current_revision, document: next, authorId: user.id, message });
  if (!saved.ok && saved.reason === "stale") return refuse({ ...answer, message: stale }, 409);
  if (!saved.ok) {
    const errors: FieldErrors = {};
    for (const issue of saved.issues) errors[fieldOf(issue.path)] ??= issue.message;
    return refuse({ ...answer, errors, message: `Not saved: ${saved.issues.map((i) => i.message).join("; ")}.` }, 400);
  }
  throw redirect(`/networks/${network.id}/cases?done=${encodeURIComponent(message)}`);
}

const SOURCE_MODES = [
  { value: "drawn", label: "as drawn" },
  { value: "set", label: "set dispatch" },
  { value: "out", label: "out of service" },
] as const;

export default function CasesPage({ loaderData }: Route.ComponentProps) {
  const { id, name, cases, canEdit, revision, growth, done } = loaderData;
  const answer = useActionData<typeof action>();
  const navigation = useNavigation();
  const busy = navigation.state !== "idle";
  const editing = answer?.intent === "save" ? answer.fields : loaderData.editing;
  const errors = answer?.errors ?? {};
  const sourceName = new Map(loaderData.sources.map((s) => [s.id, s.name]));
  const elementName = new Map([...loaderData.switchable, ...loaderData.sources].map((e) => [e.id, e.name]));

  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/networks/${id}`}>← {name}</Link>
      </p>
      <PageTitle
        title="Operating cases"
        lead={
          <>
            {name} · revision {revision} · your role <span className="role-badge">{loaderData.role}</span>
          </>
        }
        actions={
          <Link to={`/networks/${id}/study`} className="btn btn-small">
            Run the study
          </Link>
        }
      />
      {done ? <Notice tone="ok">{done}. Saved as revision {revision}.</Notice> : null}
      {answer?.message && answer.intent !== "save" && answer.intent !== "growth" ? <Notice tone="error">{answer.message}</Notice> : null}
      {loaderData.unknownCase ? <Notice tone="error">There is no case “{loaderData.unknownCase}”; pick one from the list.</Notice> : null}

      <section className="panel p-5" aria-labelledby="cases-list">
        <h2 id="cases-list" className="text-lg">
          Cases stored with the network
        </h2>
        {cases.length === 0 ? (
          <p>No operating cases: the study solves the network as drawn, as one case.</p>
        ) : (
          <div className="ks-table-scroll">
            <table className="data-table">
              <thead>
                <tr>
                  <th scope="col">Case</th>
                  <th scope="col" className="num">
                    Hours a year
                  </th>
                  <th scope="col" className="num">
                    Load scale
                  </th>
                  <th scope="col">Loads scaled on their own</th>
                  <th scope="col">Dispatch</th>
                  <th scope="col">Out of service</th>
                  {canEdit ? <th scope="col">Change</th> : null}
                </tr>
              </thead>
              <tbody>
                {cases.map((c) => (
                  <tr key={c.id}>
                    <th scope="row">
                      {c.name} <span className="ks-muted">({c.id})</span>
                    </th>
                    <td className="num">{c.hoursPerYear === undefined ? "–" : c.hoursPerYear.toLocaleString("en-GB")}</td>
                    <td className="num">× {c.loadScale}</td>
                    <td>{Object.entries(c.loads ?? {}).map(([loadId, f]) => `${elementName.get(loadId) ?? loadId} × ${f}`).join(", ") || "–"}</td>
                    <td>
                      {Object.entries(c.sources ?? {})
                        .map(([sourceId, o]) =>
                          o.inService === false
                            ? `${sourceName.get(sourceId) ?? sourceId} out`
                            : `${sourceName.get(sourceId) ?? sourceId}: ${[o.pMW !== undefined ? `P ${o.pMW} MW` : "", o.qMvar !== undefined ? `Q ${o.qMvar} Mvar` : "", o.voltagePu !== undefined ? `U ${o.voltagePu} pu` : ""].filter(Boolean).join(", ")}`,
                        )
                        .join("; ") || "as drawn"}
                    </td>
                    <td>{(c.outOfService ?? []).map((e) => elementName.get(e) ?? e).join(", ") || "–"}</td>
                    {canEdit ? (
                      <td>
                        <div className="flex flex-wrap gap-2">
                          <Link to={`?case=${encodeURIComponent(c.id)}`} className="btn btn-small" aria-label={`Edit ${c.name}`}>
                            Edit
                          </Link>
                          <Form method="post">
                            <input type="hidden" name="intent" value="delete" />
                            <input type="hidden" name="caseId" value={c.id} />
                            <input type="hidden" name="revision" value={revision} />
                            <button type="submit" className="btn btn-small" disabled={busy} aria-label={`Remove ${c.name}`}>
                              Remove
                            </button>
                          </Form>
                        </div>
                      </td>
                    ) : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {canEdit ? (
          <p className="mt-3">
            <Link to="?case=new" className="btn btn-primary btn-small">
              New case
            </Link>{" "}
            <span className="field-hint">Every change is a new revision; an earlier one can be restored on the Revisions page.</span>
          </p>
        ) : (
          <p className="field-hint mt-3">Your role may read the cases; changing them needs an editor.</p>
        )}
      </section>

      {canEdit && editing ? (
        <CaseEditor
          key={`${editing.originalId}-${revision}`}
          fields={editing}
          errors={answer?.intent === "save" ? errors : {}}
          message={answer?.intent === "save" ? answer.message : ""}
          revision={revision}
          busy={busy}
          loaderData={loaderData}
        />
      ) : null}

      <section className="panel p-5 mt-4" aria-labelledby="cases-growth">
        <h2 id="cases-growth" className="text-lg">
          Load growth
        </h2>
        <p className="field-hint">For the years study: every load grows by (1 + rate)ⁿ in year n. Empty both fields to remove it.</p>
        {answer?.intent === "growth" && answer.message ? <Notice tone="error">{answer.message}</Notice> : null}
        {canEdit ? (
          <Form method="post" className="ks-case-grid mt-2" key={`growth-${revision}`}>
            <input type="hidden" name="intent" value="growth" />
            <input type="hidden" name="revision" value={revision} />
            <NumberField
              name="ratePctPerYear"
              label="Growth rate"
              unit="% a year"
              defaultValue={answer?.intent === "growth" ? answer.values.ratePctPerYear : growth ? String(growth.ratePctPerYear) : ""}
              error={answer?.intent === "growth" ? answer.errors.ratePctPerYear : undefined}
            />
            <NumberField
              name="years"
              label="Horizon"
              unit="years"
              defaultValue={answer?.intent === "growth" ? answer.values.years : growth ? String(growth.years) : ""}
              error={answer?.intent === "growth" ? answer.errors.years : undefined}
            />
            <div className="self-end">
              <button type="submit" className="btn" disabled={busy}>
                Save growth
              </button>
            </div>
          </Form>
        ) : (
          <p>{growth ? `${growth.ratePctPerYear} % a year over ${growth.years} years.` : "None given."}</p>
        )}
      </section>
    </>
  );
}

function NumberField({ name, label, unit, defaultValue, error, placeholder }: { name: string; label: string; unit?: string; defaultValue: string; error?: string; placeholder?: string }) {
  const errorId = `${name}-error`.replace(/[^\w-]/g, "-");
  return (
    <label>
      <span className="field-label">{label}</span>
      <span className="flex items-center gap-1">
        <input
          className="input w-28"
          name={name}
          inputMode="decimal"
          defaultValue={defaultValue}
          placeholder={placeholder}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? errorId : undefined}
        />
        {unit ? <span className="ks-muted">{unit}</span> : null}
      </span>
      {error ? (
        <span id={errorId} className="field-error">
          {error}
        </span>
      ) : null}
    </label>
  );
}

function CaseEditor({
  fields,
  errors,
  message,
  revision,
  busy,
  loaderData,
}: {
  fields: CaseFields;
  errors: FieldErrors;
  message: string;
  revision: number;
  busy: boolean;
  loaderData: Route.ComponentProps["loaderData"];
}) {
  const isNew = fields.originalId === "";
  const out = new Set(fields.outOfService);
  const errorList = Object.entries(errors);
  return (
    <section className="panel p-5 mt-4 ks-case-editor" aria-labelledby="case-editor">
      <h2 id="case-editor" className="text-lg">
        {isNew ? "New operating case" : `Edit “${fields.name || fields.originalId}”`}
      </h2>
      {message ? (
        <div className="notice notice-error" role="alert">
          <p className="font-semibold">{message}</p>
          {errorList.length > 0 ? (
            <ul className="list-disc pl-5">
              {errorList.map(([field, sentence]) => (
                <li key={field}>{sentence}</li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      <Form method="post">
        <input type="hidden" name="intent" value="save" />
        <input type="hidden" name="revision" value={revision} />
        <input type="hidden" name="originalId" value={fields.originalId} />
        <div className="ks-case-grid">
          <label>
            <span className="field-label">Name</span>
            <input className="input" name="name" defaultValue={fields.name} maxLength={200} aria-invalid={errors.name ? true : undefined} aria-describedby={errors.name ? "name-error" : undefined} />
            {errors.name ? (
              <span id="name-error" className="field-error">
                {errors.name}
              </span>
            ) : null}
          </label>
          <label>
            <span className="field-label">Id</span>
            <input
              className="input"
              name="id"
              defaultValue={fields.id}
              maxLength={100}
              placeholder="made from the name"
              aria-invalid={errors.id ? true : undefined}
              aria-describedby={errors.id ? "id-error" : undefined}
            />
            {errors.id ? (
              <span id="id-error" className="field-error">
                {errors.id}
              </span>
            ) : null}
          </label>
          <NumberField name="hoursPerYear" label="Hours a year" unit="h" defaultValue={fields.hoursPerYear} error={errors.hoursPerYear} placeholder="none" />
          <NumberField name="loadScale" label="Scale of every load" unit="× drawn" defaultValue={fields.loadScale} error={errors.loadScale} />
        </div>

        <fieldset>
          <legend>Sources</legend>
          <div className="ks-table-scroll">
            <table className="data-table">
              <thead>
                <tr>
                  <th scope="col">Source</th>
                  <th scope="col">In this case</th>
                  <th scope="col">P (MW)</th>
                  <th scope="col">Q (Mvar)</th>
                  <th scope="col">Voltage (pu)</th>
                </tr>
              </thead>
              <tbody>
                {loaderData.sources.map((s) => {
                  const f = fields.sources[s.id] ?? { mode: "drawn", pMW: "", qMvar: "", voltagePu: "" };
                  const field = (key: "pMW" | "qMvar" | "voltagePu", drawn: number | null) => {
                    const name = `source.${s.id}.${key}`;
                    return (
                      <td>
                        <input
                          className="input w-24"
                          name={name}
                          inputMode="decimal"
                          defaultValue={f[key]}
                          placeholder={drawn === null ? "" : String(drawn)}
                          aria-label={`${s.name}: ${key === "pMW" ? "P in MW" : key === "qMvar" ? "Q in Mvar" : "voltage in pu"}`}
                          aria-invalid={errors[name] ? true : undefined}
                        />
                        {errors[name] ? <span className="field-error">{errors[name]}</span> : null}
                      </td>
                    );
                  };
                  return (
                    <tr key={s.id}>
                      <th scope="row">
                        {s.name} <span className="ks-muted">({s.kind}, {s.control})</span>
                      </th>
                      <td>
                        <select className="input" name={`source.${s.id}.mode`} defaultValue={f.mode} aria-label={`${s.name} in this case`}>
                          {SOURCE_MODES.map((m) => (
                            <option key={m.value} value={m.value}>
                              {m.label}
                            </option>
                          ))}
                        </select>
                        {errors[`source.${s.id}.mode`] ? <span className="field-error">{errors[`source.${s.id}.mode`]}</span> : null}
                      </td>
                      {field("pMW", s.pMW)}
                      {field("qMvar", s.qMvar)}
                      {field("voltagePu", s.voltagePu)}
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <p className="field-hint">“Set dispatch” overrides only the values given; an empty field keeps the drawn value shown faintly.</p>
        </fieldset>

        <details open={Object.keys(fields.loads).length > 0 || Object.keys(errors).some((k) => k.startsWith("load."))}>
          <summary className="font-semibold mt-4">Loads on their own scale ({loaderData.loads.length})</summary>
          <div className="ks-case-grid mt-2">
            {loaderData.loads.map((l) => (
              <NumberField
                key={l.id}
                name={`load.${l.id}`}
                label={`${l.name} (${l.pMW} MW)`}
                unit="× drawn"
                defaultValue={fields.loads[l.id] ?? ""}
                error={errors[`load.${l.id}`]}
                placeholder="case scale"
              />
            ))}
          </div>
        </details>

        <details open={out.size > 0}>
          <summary className="font-semibold mt-4">Out of service ({out.size} of {loaderData.switchable.length})</summary>
          <div className="ks-case-grid mt-2">
            {loaderData.switchable.map((e) => (
              <label key={e.id} className="ks-check">
                <input type="checkbox" name="out" value={e.id} defaultChecked={out.has(e.id)} /> {e.name} <span className="ks-muted">({e.kind})</span>
              </label>
            ))}
          </div>
          {errors.out ? <p className="field-error">{errors.out}</p> : null}
        </details>

        <div className="mt-4 flex gap-2">
          <button type="submit" className="btn btn-primary" disabled={busy}>
            {isNew ? "Add the case" : "Save the case"}
          </button>
          <Link to="." className="btn">
            Cancel
          </Link>
        </div>
      </Form>
    </section>
  );
}
