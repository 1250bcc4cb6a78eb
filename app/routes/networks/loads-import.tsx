import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/loads-import";
import { RowProblems } from "#app/components/ImportProblems.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { formatNumber } from "#app/lib/format.ts";
import { delimiterName, type RowError } from "#app/lib/imports/csvTable.ts";
import { previewLoadsCsv, type LoadChange } from "#app/lib/imports/loadsCsv.ts";
import { currentDocument, saveNetworkDocument } from "#app/lib/networks.server.ts";
import { readUploadedFile } from "#app/lib/uploadForm.server.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Import loads · ${data?.name ?? "Network"} · Kilostep` }];

async function editableNetwork(request: Request, params: { networkId: string }) {
  const { db, user, network } = await requireNetwork(request, params, "edit");
  const checked = validateNetwork((await currentDocument(db, network)).document);
  if (!checked.ok) throw data(`Revision ${network.current_revision} no longer passes the network file's checks; fix it on the sheet first.`, { status: 409 });
  return { user, db, network, document: checked.network };
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { network, document } = await editableNetwork(request, params);
  return {
    id: network.id,
    name: network.name,
    revision: network.current_revision,
    // A reminder of names, not a directory: a 10,000-bus network's list would only weigh the page down.
    buses: document.buses.slice(0, SHOWN_BUSES).map((b) => ({ id: b.id, name: b.name, nominalKV: b.nominalKV })),
    busCount: document.buses.length,
    loadCount: document.loads.length,
  };
}

interface ImportOutcome {
  ok: boolean;
  stage: "preview" | "applied";
  fileName: string | null;
  fileError?: string;
  rowErrors: RowError[];
  totalRowErrors: number;
  /** The first SHOWN_CHANGES changes; a page of 20,000 rows helps nobody and outlasts the render budget. */
  changes: LoadChange[];
  added: number;
  updated: number;
  ignoredColumns: string[];
  /** The separator in words, e.g. "semicolon". */
  separator?: string;
  /** The revision the preview was read against; applying requires it to still be current. */
  revision: number;
}

function refused(message: string, revision: number, status = 400, fileName: string | null = null) {
  return data<ImportOutcome>(
    { ok: false, stage: "preview", fileName, fileError: message, rowErrors: [], totalRowErrors: 0, changes: [], added: 0, updated: 0, ignoredColumns: [], revision },
    { status },
  );
}

/** How many buses the page lists as a reminder of their names. */
const SHOWN_BUSES = 300;

/** How many changes the preview lists; the counts always cover the whole file. */
export const SHOWN_CHANGES = 200;

/** "preview" reads the file against the current revision; "apply" saves it as the next revision, all rows or none. */
export async function action({ request, params }: Route.ActionArgs) {
  const { user, db, network, document } = await editableNetwork(request, params);
  const upload = await readUploadedFile(request, "A loads file");
  if (!upload.ok) return refused(upload.error, network.current_revision);
  const preview = previewLoadsCsv(upload.text, document, upload.byteLength);
  const added = preview.changes.filter((c) => c.action === "new").length;
  const outcome: ImportOutcome = {
    ok: preview.ok,
    stage: "preview",
    fileName: upload.fileName,
    fileError: preview.fileError,
    rowErrors: preview.rowErrors,
    totalRowErrors: preview.totalRowErrors,
    changes: preview.changes.slice(0, SHOWN_CHANGES),
    added,
    updated: preview.changes.length - added,
    ignoredColumns: preview.ignoredColumns,
    separator: preview.delimiter ? delimiterName(preview.delimiter) : undefined,
    revision: network.current_revision,
  };
  if (!preview.ok) return data(outcome, { status: 400 });
  if (upload.form.get("intent") !== "apply") return outcome;

  const previewedRevision = parseId(String(upload.form.get("revision") ?? ""));
  if (previewedRevision !== network.current_revision)
    return refused(
      `The network changed since the preview (it is now at revision ${network.current_revision}). Nothing was saved; check the file again.`,
      network.current_revision,
      409,
      upload.fileName,
    );
  const message = `Loads from ${upload.fileName || "a CSV file"}: ${added} added, ${outcome.updated} updated`;
  const saved = await saveNetworkDocument(db, {
    networkId: network.id,
    expectedRevision: network.current_revision,
    document: preview.network as Network,
    authorId: user.id,
    message: message.slice(0, 500),
  });
  if (!saved.ok && saved.reason === "stale")
    return refused("Someone saved the network while the file was being applied. Nothing was saved; check the file again.", saved.currentRevision ?? network.current_revision, 409, upload.fileName);
  if (!saved.ok) return refused(saved.issues.map((i) => `${i.path}: ${i.message}`).join("; "), network.current_revision, 400, upload.fileName);
  return { ...outcome, stage: "applied" as const, changes: [], revision: saved.revision };
}

function ChangeTable({ changes, added, updated }: { changes: LoadChange[]; added: number; updated: number }) {
  const total = added + updated;
  return (
    <div className="relative mt-3 overflow-x-auto">
      <table className="data-table">
        <caption className="text-left">
          {formatNumber(added)} new, {formatNumber(updated)} updated
          {total > changes.length ? ` (the first ${changes.length} rows shown)` : ""}
        </caption>
        <thead>
          <tr>
            <th scope="col" className="num">
              Row
            </th>
            <th scope="col">Change</th>
            <th scope="col">Load</th>
            <th scope="col">Bus</th>
            <th scope="col" className="num">
              P <span className="unit">MW</span>
            </th>
            <th scope="col" className="num">
              Q <span className="unit">Mvar</span>
            </th>
            <th scope="col">Model</th>
          </tr>
        </thead>
        <tbody>
          {changes.map((change) => (
            <tr key={change.row}>
              <td className="num">{change.row}</td>
              <td>{change.action === "new" ? "new" : "update"}</td>
              <td>
                {change.load.name} <span className="text-sm text-ink-muted">({change.load.id})</span>
                {change.note ? <span className="block text-sm text-ink-muted">{change.note}</span> : null}
              </td>
              <td>{change.load.bus}</td>
              <td className="num">
                {formatNumber(change.load.pMW)}
                {change.previous ? <span className="block text-sm text-ink-muted">was {formatNumber(change.previous.pMW)}</span> : null}
              </td>
              <td className="num">
                {formatNumber(change.load.qMvar)}
                {change.previous ? <span className="block text-sm text-ink-muted">was {formatNumber(change.previous.qMvar)}</span> : null}
              </td>
              <td>{change.load.model}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export default function ImportLoads({ loaderData, actionData }: Route.ComponentProps) {
  const { id, name, revision, buses, busCount, loadCount } = loaderData;
  const busy = useNavigation().state === "submitting";
  const outcome = actionData;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/networks/${id}`}>← {name}</Link>
      </p>
      <PageTitle
        title="Import loads from a CSV file"
        lead={`Into revision ${revision} of ${name}, which has ${loadCount} load${loadCount === 1 ? "" : "s"}. The import is saved as one new revision: every row, or none.`}
      />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <Form method="post" encType="multipart/form-data" className="panel space-y-4 p-5">
          <input type="hidden" name="revision" value={outcome?.revision ?? revision} />
          <div>
            <label htmlFor="loads-file" className="field-label">
              Loads file (CSV, at most 5 MB)
            </label>
            <input id="loads-file" type="file" name="file" accept=".csv,.txt,text/csv" className="block" required aria-describedby="loads-file-hint" />
            <p id="loads-file-hint" className="field-hint">
              Choose the file again to apply it after the preview.
            </p>
          </div>
          <div className="flex flex-wrap gap-2">
            <button type="submit" name="intent" value="preview" className="btn" disabled={busy}>
              Preview
            </button>
            <button type="submit" name="intent" value="apply" className="btn btn-primary" disabled={busy || outcome?.ok === false}>
              {busy ? "Working…" : "Apply as a new revision"}
            </button>
          </div>
        </Form>
        <aside className="panel p-5 text-sm" aria-labelledby="loads-columns">
          <h2 id="loads-columns" className="text-lg">
            Columns
          </h2>
          <ul className="mt-2 list-disc space-y-1 pl-5">
            <li>
              <code>bus</code>: the bus id or its name
            </li>
            <li>
              <code>name</code>: a load of that name is updated, any other is added (or give an <code>id</code> column)
            </li>
            <li>
              <code>P (MW)</code>: the unit may be in the header (<code>P (kW)</code>) or the cell (<code>250 kW</code>)
            </li>
            <li>
              <code>Q (Mvar)</code>, or <code>power factor</code> such as <code>0.9</code>, <code>0.9 lagging</code>, <code>0.95 leading</code>
            </li>
            <li>
              <code>model</code> (optional): constant-power, constant-current or constant-impedance
            </li>
          </ul>
          <p className="mt-2">Commas, semicolons (with decimal commas) or tabs; the first row is the header.</p>
          <details className="mt-2">
            <summary>
              Buses of this network{busCount > buses.length ? ` (the first ${buses.length} of ${formatNumber(busCount)})` : ""}
            </summary>
            <ul className="mt-1">
              {buses.map((b) => (
                <li key={b.id}>
                  <code>{b.id}</code> {b.name} ({b.nominalKV} kV)
                </li>
              ))}
            </ul>
          </details>
        </aside>
      </div>
      {outcome ? (
        <section aria-labelledby="loads-outcome" className="panel mt-6 p-5">
          <h2 id="loads-outcome" className="text-lg">
            {outcome.fileName ?? "The file"}
            {outcome.separator ? `, separated by ${outcome.separator}` : ""}
          </h2>
          <div className="mt-3">
            {outcome.stage === "applied" ? (
              <Notice tone="ok">
                Saved as revision {outcome.revision}: {formatNumber(outcome.added)} loads added, {formatNumber(outcome.updated)} updated. <Link to={`/networks/${id}`}>Open the sheet</Link>.
              </Notice>
            ) : outcome.ok ? (
              <Notice tone="info">Nothing is saved yet. Check the changes below, then apply the same file.</Notice>
            ) : (
              <Notice tone="error">
                {outcome.fileError ?? "Some rows cannot be read."} Nothing was saved.
              </Notice>
            )}
          </div>
          {outcome.ignoredColumns.length > 0 ? (
            <p className="mt-2 text-sm text-ink-muted">Not used: {outcome.ignoredColumns.map((c) => `"${c}"`).join(", ")}.</p>
          ) : null}
          <RowProblems errors={outcome.rowErrors} total={outcome.totalRowErrors} />
          {outcome.ok && outcome.changes.length > 0 ? <ChangeTable changes={outcome.changes} added={outcome.added} updated={outcome.updated} /> : null}
        </section>
      ) : null}
    </>
  );
}
