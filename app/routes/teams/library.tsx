import { useState } from "react";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/library";
import { RowProblems } from "#app/components/ImportProblems.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireTeam } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import type { Db } from "#app/lib/db.server.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { formFields } from "#app/lib/forms.ts";
import type { RowError } from "#app/lib/imports/csvTable.ts";
import { previewLibraryCsv, type LibraryTypeChange } from "#app/lib/imports/libraryCsv.ts";
import { removeLibraryType, saveLibraryTypes, teamHasLibraryType, teamLibrary, type LibraryEntry } from "#app/lib/library.server.ts";
import { libraryFields, type LibraryField } from "#app/lib/libraryFields.ts";
import { unitLabel } from "#app/lib/unitFormat.ts";
import { readTypeForm } from "#app/lib/libraryForm.ts";
import type { LibraryTypeKind } from "#app/lib/libraryTypes.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { readUploadedFile } from "#app/lib/uploadForm.server.ts";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Equipment library · ${data?.team.name ?? "Team"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, team, role } = await requireTeam(request, params, "view-team");
  return { team: { id: team.id, name: team.name }, role, canEdit: roleAllows(role, "edit-library"), types: await teamLibrary(db, team.id) };
}

type ActionResult =
  | { intent: "save-type"; ok: boolean; message: string; fieldErrors?: Record<string, string>; formKey: string }
  | { intent: "delete-type"; ok: boolean; message: string }
  | {
      intent: "import";
      stage: "preview" | "applied";
      ok: boolean;
      message: string;
      rowErrors: RowError[];
      totalRowErrors: number;
      changes: LibraryTypeChange[];
      ignoredColumns: string[];
    };

function isKind(value: unknown): value is LibraryTypeKind {
  return value === "transformer" || value === "conductor";
}

async function importAction(request: Request, teamId: number, userId: number, db: Db) {
  const upload = await readUploadedFile(request, "A library file");
  const failed = (message: string, status = 400) =>
    data<ActionResult>({ intent: "import", stage: "preview", ok: false, message, rowErrors: [], totalRowErrors: 0, changes: [], ignoredColumns: [] }, { status });
  if (!upload.ok) return failed(upload.error);
  const kindField = upload.form.get("kind");
  const frequency = Number(upload.form.get("frequencyHz"));
  if (frequency !== 50 && frequency !== 60) return failed("Say at which frequency the conductor impedances are given: 50 or 60 Hz.");
  const existing = (await teamLibrary(db, teamId)).map(({ id, kind, name }) => ({ id, kind, name }));
  const preview = previewLibraryCsv(upload.text, {
    kind: isKind(kindField) ? kindField : undefined,
    frequencyHz: frequency,
    existing,
    byteLength: upload.byteLength,
  });
  const result: ActionResult = {
    intent: "import",
    stage: "preview",
    ok: preview.ok,
    message: preview.fileError ?? (preview.ok ? "" : "Some rows cannot be read."),
    rowErrors: preview.rowErrors,
    totalRowErrors: preview.totalRowErrors,
    changes: preview.changes,
    ignoredColumns: preview.ignoredColumns,
  };
  if (!preview.ok) return data(result, { status: 400 });
  if (upload.form.get("intent") !== "import-apply") return result;
  const written = await saveLibraryTypes(db, {
    teamId,
    userId,
    types: preview.changes.map((c) => ({ kind: c.kind, name: c.name, data: c.data, id: c.id })),
  });
  if (!written.ok) return failed(written.error, 409);
  return { ...result, stage: "applied" as const, message: `Saved: ${written.created} new, ${written.updated} updated.` };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user, db, team } = await requireTeam(request, params, "edit-library");
  if ((request.headers.get("Content-Type") ?? "").startsWith("multipart/form-data")) return importAction(request, team.id, user.id, db);

  const fields = formFields(await request.formData());
  if (fields.intent === "delete-type") {
    const id = parseId(fields.typeId);
    if (id === null || !(await removeLibraryType(db, team.id, id)))
      return data<ActionResult>({ intent: "delete-type", ok: false, message: "That type is not in this team's library any more." }, { status: 404 });
    return { intent: "delete-type", ok: true, message: `Deleted "${fields.typeName ?? "the type"}".` } satisfies ActionResult;
  }
  if (fields.intent === "save-type") {
    // "typeKind", not "kind": a conductor's own construction field is called kind.
    const formKey = fields.typeId || `new-${fields.typeKind}`;
    if (!isKind(fields.typeKind)) return data<ActionResult>({ intent: "save-type", ok: false, message: "Choose transformer or conductor.", formKey }, { status: 400 });
    const read = readTypeForm(fields.typeKind, fields);
    if (!read.ok) return data<ActionResult>({ intent: "save-type", ok: false, message: "Some fields need attention.", fieldErrors: read.fieldErrors, formKey }, { status: 400 });
    const id = fields.typeId ? parseId(fields.typeId) : undefined;
    if (id === null) return data<ActionResult>({ intent: "save-type", ok: false, message: "Which type? The form names none.", formKey }, { status: 400 });
    if (id !== undefined && !(await teamHasLibraryType(db, team.id, id))) {
      return data<ActionResult>({ intent: "save-type", ok: false, message: "That type is not in this team's library any more.", formKey }, { status: 404 });
    }
    const written = await saveLibraryTypes(db, { teamId: team.id, userId: user.id, types: [{ kind: read.kind, name: read.name, data: read.data, id, basedOn: id === undefined ? undefined : fields.basedOn }] });
    if (!written.ok) {
      const fieldErrors = written.reason === "name-taken" ? { name: "another type has this name" } : undefined;
      return data<ActionResult>({ intent: "save-type", ok: false, message: written.error, fieldErrors, formKey }, { status: 409 });
    }
    return { intent: "save-type", ok: true, message: `Saved "${read.name}".`, formKey } satisfies ActionResult;
  }
  return data<ActionResult>({ intent: "delete-type", ok: false, message: "Unknown request: the form named no known action." }, { status: 400 });
}

function fieldValue(entry: LibraryEntry | undefined, name: string): string {
  if (!entry) return "";
  const value = (entry.data as Record<string, unknown>)[name];
  return value === undefined ? "" : String(value);
}

function unitOf(field: LibraryField): string {
  return field.kind ? unitLabel(field.kind) : "";
}

function TypeForm({ kind, entry, result }: { kind: LibraryTypeKind; entry?: LibraryEntry; result?: ActionResult }) {
  const formKey = entry ? String(entry.id) : `new-${kind}`;
  const mine = result?.intent === "save-type" && result.formKey === formKey ? result : undefined;
  const errors = mine?.fieldErrors ?? {};
  const idPrefix = `type-${formKey}`;
  return (
    <Form method="post" className="grid gap-3 sm:grid-cols-2">
      <input type="hidden" name="intent" value="save-type" />
      <input type="hidden" name="typeKind" value={kind} />
      {entry ? <input type="hidden" name="typeId" value={entry.id} /> : null}
      {entry ? <input type="hidden" name="basedOn" value={entry.updatedAt} /> : null}
      <div className="sm:col-span-2">
        <label htmlFor={`${idPrefix}-name`} className="field-label">
          Name
        </label>
        <input id={`${idPrefix}-name`} name="name" className="input" defaultValue={entry?.name ?? ""} required aria-invalid={errors.name ? true : undefined} />
        {errors.name ? <p className="field-error">{errors.name}</p> : null}
      </div>
      {libraryFields[kind].map((field) => {
        const id = `${idPrefix}-${field.name}`;
        return (
          <div key={field.name}>
            <label htmlFor={id} className="field-label">
              {field.label}
              {unitOf(field) ? ` (${unitOf(field)})` : ""}
              {field.optional ? <span className="text-ink-muted"> (optional)</span> : null}
            </label>
            {field.choices ? (
              <select id={id} name={field.name} className="input" defaultValue={fieldValue(entry, field.name) || (field.optional ? "" : field.choices[0])}>
                {field.optional ? <option value="">not given</option> : null}
                {field.choices.map((choice) => (
                  <option key={choice} value={choice}>
                    {choice}
                  </option>
                ))}
              </select>
            ) : (
              <input
                id={id}
                name={field.name}
                className="input"
                defaultValue={fieldValue(entry, field.name)}
                required={!field.optional}
                aria-invalid={errors[field.name] ? true : undefined}
                aria-describedby={field.hint ? `${id}-hint` : undefined}
              />
            )}
            {field.hint ? (
              <p id={`${id}-hint`} className="field-hint">
                {field.hint}
              </p>
            ) : null}
            {errors[field.name] ? <p className="field-error">{errors[field.name]}</p> : null}
          </div>
        );
      })}
      <div className="sm:col-span-2">
        <button type="submit" className="btn btn-primary">
          {entry ? "Save changes" : "Add type"}
        </button>
        {mine && !mine.ok ? <p className="field-error">{mine.message}</p> : null}
      </div>
    </Form>
  );
}

function TypeTable({ kind, types, canEdit, result }: { kind: LibraryTypeKind; types: LibraryEntry[]; canEdit: boolean; result?: ActionResult }) {
  const columns = libraryFields[kind];
  if (types.length === 0) return <p className="p-4 text-ink-soft">None yet.</p>;
  return (
    <table className="data-table">
      <thead>
        <tr>
          <th scope="col">Name</th>
          {columns.map((field) => (
            <th key={field.name} scope="col" className={field.kind && field.kind !== "ratio" ? "num" : undefined}>
              {field.label} {unitOf(field) ? <span className="unit">{unitOf(field)}</span> : null}
            </th>
          ))}
          <th scope="col">Changed</th>
          {canEdit ? (
            <th scope="col">
              <span className="sr-only">Actions</span>
            </th>
          ) : null}
        </tr>
      </thead>
      <tbody>
        {types.map((entry) => (
          <tr key={entry.id}>
            <td className="font-medium">{entry.name}</td>
            {columns.map((field) => (
              <td key={field.name} className={field.kind && field.kind !== "ratio" ? "num" : undefined}>
                {fieldValue(entry, field.name) || "–"}
              </td>
            ))}
            <td className="whitespace-nowrap text-sm">
              {formatDateTime(entry.updatedAt)}
              {entry.createdByName ? <span className="block text-ink-muted">added by {entry.createdByName}</span> : null}
            </td>
            {canEdit ? (
              <td>
                <details>
                  <summary className="btn btn-small">Edit</summary>
                  <div className="mt-3 w-[28rem] max-w-full">
                    <TypeForm kind={kind} entry={entry} result={result} />
                  </div>
                </details>
                <Form method="post" className="mt-2">
                  <input type="hidden" name="intent" value="delete-type" />
                  <input type="hidden" name="typeId" value={entry.id} />
                  <input type="hidden" name="typeName" value={entry.name} />
                  <button type="submit" className="btn btn-small btn-danger" aria-label={`Delete ${entry.name}`}>
                    Delete
                  </button>
                </Form>
              </td>
            ) : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function ImportForm({ result }: { result?: ActionResult }) {
  const busy = useNavigation().state === "submitting";
  const outcome = result?.intent === "import" ? result : undefined;
  return (
    <section aria-labelledby="library-import" className="panel mt-6 p-5">
      <h2 id="library-import" className="text-lg">
        Import types from a CSV file
      </h2>
      <p className="mt-1 text-sm text-ink-soft">
        Transformers: <code>name, ratedMVA, hvKV, lvKV, impedancePct, loadLossKW, noLoadLossKW, vectorGroup</code>. Conductors:{" "}
        <code>name, kind, rOhmPerKm, xOhmPerKm, bMicroSiemensPerKm, ampacityA</code>. Units may go in the header, such as{" "}
        <code>rated (kVA)</code>. A type whose name is already in the library is updated. Every row is saved, or none.
      </p>
      <Form method="post" encType="multipart/form-data" className="mt-4 grid gap-3 sm:grid-cols-3">
        <div className="sm:col-span-3">
          <label htmlFor="library-file" className="field-label">
            Library file (CSV, at most 5 MB)
          </label>
          <input id="library-file" type="file" name="file" accept=".csv,.txt,text/csv" required className="block" />
        </div>
        <div>
          <label htmlFor="library-kind" className="field-label">
            The file holds
          </label>
          <select id="library-kind" name="kind" className="input" defaultValue="">
            <option value="">read it from the header</option>
            <option value="transformer">transformers</option>
            <option value="conductor">conductors</option>
          </select>
        </div>
        <div>
          <label htmlFor="library-frequency" className="field-label">
            Conductor impedances at
          </label>
          <select id="library-frequency" name="frequencyHz" className="input" defaultValue="50">
            <option value="50">50 Hz</option>
            <option value="60">60 Hz</option>
          </select>
        </div>
        <div className="flex items-end gap-2">
          <button type="submit" name="intent" value="import-preview" className="btn" disabled={busy}>
            Preview
          </button>
          <button type="submit" name="intent" value="import-apply" className="btn btn-primary" disabled={busy || outcome?.ok === false}>
            Save all
          </button>
        </div>
      </Form>
      {outcome ? (
        <div className="mt-4">
          {outcome.stage === "applied" ? (
            <Notice tone="ok">{outcome.message}</Notice>
          ) : outcome.ok ? (
            <Notice tone="info">
              Nothing is saved yet: {outcome.changes.filter((c) => c.action === "new").length} new and{" "}
              {outcome.changes.filter((c) => c.action === "update").length} updated types would be saved. Choose the same file and save all.
            </Notice>
          ) : (
            <Notice tone="error">{outcome.message} Nothing was saved.</Notice>
          )}
          {outcome.ignoredColumns.length > 0 ? (
            <p className="mt-2 text-sm text-ink-muted">Not used: {outcome.ignoredColumns.map((c) => `"${c}"`).join(", ")}.</p>
          ) : null}
          <RowProblems errors={outcome.rowErrors} total={outcome.totalRowErrors} />
          {outcome.ok && outcome.stage === "preview" ? (
            <ul className="mt-3 list-disc pl-5 text-sm">
              {outcome.changes.map((c) => (
                <li key={c.row}>
                  row {c.row}: {c.action === "new" ? "new" : "update"} {c.kind} "{c.name}"
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}

export default function TeamLibrary({ loaderData, actionData }: Route.ComponentProps) {
  const { team, role, canEdit, types } = loaderData;
  const [adding, setAdding] = useState<LibraryTypeKind>("transformer");
  const notice = actionData && actionData.intent !== "import" && actionData.ok ? actionData.message : undefined;
  const problem = actionData && actionData.intent === "delete-type" && !actionData.ok ? actionData.message : undefined;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/teams/${team.id}`}>← {team.name}</Link>
      </p>
      <PageTitle
        title="Equipment library"
        lead={
          canEdit
            ? `The transformer and conductor types ${team.name} buys, offered on the sheet beside the built-in types.`
            : `The types ${team.name} keeps. Your role is ${role}, so you can read them but not change them.`
        }
      />
      {notice ? (
        <div className="mb-4">
          <Notice tone="ok">{notice}</Notice>
        </div>
      ) : null}
      {problem ? (
        <div className="mb-4">
          <Notice tone="error">{problem}</Notice>
        </div>
      ) : null}
      {(["transformer", "conductor"] as const).map((kind) => (
        <section key={kind} aria-labelledby={`library-${kind}`} className="relative panel mb-6 overflow-x-auto" tabIndex={0}>
          <h2 id={`library-${kind}`} className="p-4 pb-0 text-lg">
            {kind === "transformer" ? "Transformers" : "Conductors"}
          </h2>
          <TypeTable kind={kind} types={types.filter((t) => t.kind === kind)} canEdit={canEdit} result={actionData} />
        </section>
      ))}
      {canEdit ? (
        <>
          <section aria-labelledby="library-add" className="panel p-5">
            <h2 id="library-add" className="text-lg">
              Add a type
            </h2>
            <div className="my-3">
              <label htmlFor="library-add-kind" className="field-label">
                Kind
              </label>
              <select
                id="library-add-kind"
                className="input max-w-xs"
                value={adding}
                onChange={(event) => setAdding(event.currentTarget.value as LibraryTypeKind)}
              >
                <option value="transformer">Transformer</option>
                <option value="conductor">Conductor</option>
              </select>
            </div>
            <TypeForm key={adding} kind={adding} result={actionData} />
          </section>
          <ImportForm result={actionData} />
        </>
      ) : null}
    </>
  );
}
