// /networks/:id/revisions — Revisions: every save with its author, time and message; the
// difference between any two (?from=&to=, by default the last save against the one before);
// open one read only; restore one as a new revision (editors).
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/revisions";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { RevisionDiffView } from "#app/components/review/RevisionDiffView.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { compareRevisions, restoreRevision, revisionHistory } from "#app/lib/revisions.server.ts";
import { markRevisionIssued, nameRevision } from "#db/networks.ts";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Revisions · ${data?.name ?? "Network"} · Kilostep` }];

function revisionParam(value: string | null, fallback: number): number {
  const parsed = parseId(value);
  return parsed ?? fallback;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, role } = await requireNetwork(request, params, "view");
  const revisions = await revisionHistory(db, network.id);
  const search = new URL(request.url).searchParams;
  const current = network.current_revision;
  const to = revisionParam(search.get("to"), current);
  const from = revisionParam(search.get("from"), Math.max(1, to - 1));
  const compared = revisions.length > 1 ? await compareRevisions(db, network.id, from, to) : null;
  return {
    id: network.id,
    name: network.name,
    current,
    mayRestore: roleAllows(role, "edit"),
    revisions,
    from,
    to,
    diff: compared?.ok ? compared.diff : null,
    diffError: compared && !compared.ok ? compared.error : null,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { db, user, network } = await requireNetwork(request, params, "edit");
  const form = await request.formData();
  const number = parseId(String(form.get("number") ?? ""));
  if (number === null) return data({ ok: false, message: "Which revision? The request names none." }, { status: 400 });
  const intent = form.get("intent");
  if (intent === "name") {
    const message = String(form.get("message") ?? "").trim();
    if (!message || message.length > 200) return data({ ok: false, message: "A revision's name has 1 to 200 characters." }, { status: 400 });
    if (!(await nameRevision(db, network.id, number, message))) return data({ ok: false, message: `There is no revision ${number}.` }, { status: 404 });
    return { ok: true, message: `Revision ${number} is named "${message}".` };
  }
  if (intent === "issue") {
    if (!(await markRevisionIssued(db, network.id, number, user.id)))
      return data({ ok: false, message: `Revision ${number} does not exist or is already issued.` }, { status: 409 });
    return { ok: true, message: `Revision ${number} is marked issued.` };
  }
  if (intent !== "restore") return data({ ok: false, message: "Unknown request: the form named no known action." }, { status: 400 });
  const restored = await restoreRevision(db, { network, number, by: user });
  if (!restored.ok) return data({ ok: false, message: restored.error }, { status: restored.status });
  return { ok: true, message: `Revision ${number} is restored as revision ${restored.revision}.` };
}

export default function RevisionsPage({ loaderData, actionData }: Route.ComponentProps) {
  const { id, name, current, mayRestore, revisions, from, to, diff, diffError } = loaderData;
  const busy = useNavigation().state === "submitting";
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/networks/${id}`}>← {name}</Link>
      </p>
      <PageTitle
        title="Revisions"
        lead={`Every editing session of "${name}" is one revision, newest first; name one, or mark it issued, to keep it apart. Revision ${current} is the current one.`}
      />
      {actionData ? (
        <div className="mb-6">
          <Notice tone={actionData.ok ? "ok" : "error"}>{actionData.message}</Notice>
        </div>
      ) : null}
      <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <section aria-labelledby="revision-list-title" className="relative panel overflow-x-auto p-5" tabIndex={0}>
          <h2 id="revision-list-title" className="text-lg">
            History
          </h2>
          <table className="mt-3 w-full text-sm">
            <caption className="sr-only">Revisions of {name}</caption>
            <thead>
              <tr className="text-left text-ink-muted">
                <th scope="col" className="py-1 pr-3 font-semibold">
                  No.
                </th>
                <th scope="col" className="py-1 pr-3 font-semibold">
                  Saved
                </th>
                <th scope="col" className="py-1 pr-3 font-semibold">
                  Message
                </th>
                <th scope="col" className="py-1 font-semibold">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {revisions.map((r) => (
                <tr key={r.number} className="border-t border-paper-rule align-top">
                  <td className="py-2 pr-3 font-semibold">
                    {r.number}
                    {r.number === current ? <span className="ml-1 font-normal text-ink-muted">(current)</span> : null}
                  </td>
                  <td className="py-2 pr-3">
                    {formatDateTime(r.savedAt)}
                    <br />
                    <span className="text-ink-muted">{r.authorName ?? "a removed account"}</span>
                  </td>
                  <td className="py-2 pr-3">
                    {r.message || (
                      <span className="text-ink-muted">
                        Editing session{r.foldedSaves ? `, ${r.foldedSaves + 1} saves` : ""}
                      </span>
                    )}
                    <span className="mt-1 flex flex-wrap gap-1">
                      {r.issuedAt ? (
                        <span className="role-badge">
                          Issued {formatDateTime(r.issuedAt)}
                          {r.issuedByName ? ` by ${r.issuedByName}` : ""}
                        </span>
                      ) : null}
                      {r.layoutOnly ? <span className="role-badge">Layout only: no engineering change</span> : null}
                      {r.problemCount ? (
                        <span className="role-badge">
                          Draft: {r.problemCount} {r.problemCount === 1 ? "problem" : "problems"}
                        </span>
                      ) : null}
                    </span>
                    {mayRestore ? (
                      <Form method="post" className="mt-1 flex flex-wrap gap-1">
                        <input type="hidden" name="intent" value="name" />
                        <input type="hidden" name="number" value={r.number} />
                        <label className="sr-only" htmlFor={`revision-name-${r.number}`}>
                          Name of revision {r.number}
                        </label>
                        <input id={`revision-name-${r.number}`} name="message" className="input min-w-0 flex-1" defaultValue={r.message} maxLength={200} required />
                        <button type="submit" className="btn btn-small" disabled={busy} aria-label={`Name revision ${r.number}`}>
                          Name
                        </button>
                      </Form>
                    ) : null}
                  </td>
                  <td className="py-2">
                    <div className="flex flex-wrap gap-2">
                      <Link to={`/networks/${id}/revisions/${r.number}`} className="btn btn-small" aria-label={`Open revision ${r.number}`}>
                        Open
                      </Link>
                      {r.number !== current ? (
                        <Link to={`?from=${r.number}&to=${current}`} className="btn btn-small" aria-label={`Compare revision ${r.number} with the current one`}>
                          Compare
                        </Link>
                      ) : null}
                      {mayRestore && !r.issuedAt ? (
                        <Form method="post">
                          <input type="hidden" name="intent" value="issue" />
                          <input type="hidden" name="number" value={r.number} />
                          <button type="submit" className="btn btn-small" disabled={busy} aria-label={`Mark revision ${r.number} issued`}>
                            Mark issued
                          </button>
                        </Form>
                      ) : null}
                      {mayRestore && r.number !== current ? (
                        <Form method="post">
                          <input type="hidden" name="intent" value="restore" />
                          <input type="hidden" name="number" value={r.number} />
                          <button type="submit" className="btn btn-small" disabled={busy} aria-label={`Restore revision ${r.number}`}>
                            Restore
                          </button>
                        </Form>
                      ) : null}
                    </div>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>

        <section aria-labelledby="diff-title" className="panel p-5">
          <h2 id="diff-title" className="text-lg">
            Difference
          </h2>
          {revisions.length > 1 ? (
            <Form method="get" className="mt-3 flex flex-wrap items-end gap-3">
              <div>
                <label htmlFor="diff-from" className="field-label">
                  From revision
                </label>
                <select id="diff-from" name="from" defaultValue={from} className="input" key={`from-${from}`}>
                  {revisions.map((r) => (
                    <option key={r.number} value={r.number}>
                      {r.number}
                    </option>
                  ))}
                </select>
              </div>
              <div>
                <label htmlFor="diff-to" className="field-label">
                  To revision
                </label>
                <select id="diff-to" name="to" defaultValue={to} className="input" key={`to-${to}`}>
                  {revisions.map((r) => (
                    <option key={r.number} value={r.number}>
                      {r.number}
                    </option>
                  ))}
                </select>
              </div>
              <button type="submit" className="btn btn-small">
                Compare
              </button>
            </Form>
          ) : (
            <p className="mt-2 text-ink-soft">There is only one revision so far.</p>
          )}
          <div className="mt-4">
            {diffError ? <Notice tone="error">{diffError}</Notice> : null}
            {diff ? <RevisionDiffView diff={diff} from={from} to={to} /> : null}
          </div>
        </section>
      </div>
    </>
  );
}
