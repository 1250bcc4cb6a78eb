// /networks/:id/revisions/:number — one past revision on the sheet, read only, with its readings;
// an editor may restore it as a new revision.
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/revision";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { SheetEditor } from "#app/components/sheet/SheetEditor.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { checkedRevision } from "#app/lib/revisions.server.ts";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Revision ${data?.number ?? ""} · ${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, role } = await requireNetwork(request, params, "view");
  const number = parseId(params.number);
  if (number === null) throw data(`"${params.number}" is not a revision number.`, { status: 404 });
  const revision = await checkedRevision(db, network.id, number);
  if (!revision) throw data(`"${network.name}" has no revision ${number}; its newest is ${network.current_revision}.`, { status: 404 });
  return {
    id: network.id,
    name: network.name,
    number,
    current: network.current_revision,
    mayRestore: roleAllows(role, "edit") && number !== network.current_revision,
    revision,
  };
}

export default function RevisionPage({ loaderData }: Route.ComponentProps) {
  const { id, name, number, current, mayRestore, revision } = loaderData;
  const busy = useNavigation().state === "submitting";
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/networks/${id}/revisions`}>← Revisions of {name}</Link>
      </p>
      <PageTitle
        title={`${name}, revision ${number}`}
        lead={
          revision.ok ? (
            <>
              <span className="role-badge">read only</span> · saved {formatDateTime(revision.createdAt)}
              {revision.authorName ? ` by ${revision.authorName}` : ""}
              {revision.message ? ` (“${revision.message}”)` : ""} · the current revision is {current}
            </>
          ) : (
            `The current revision is ${current}.`
          )
        }
        actions={
          <>
            {number !== current ? (
              <Link to={`/networks/${id}/revisions?from=${number}&to=${current}`} className="btn btn-small">
                Compare with current
              </Link>
            ) : null}
            {mayRestore ? (
              <Form method="post" action={`/networks/${id}/revisions`}>
                <input type="hidden" name="intent" value="restore" />
                <input type="hidden" name="number" value={number} />
                <button type="submit" className="btn btn-primary btn-small" disabled={busy}>
                  Restore as a new revision
                </button>
              </Form>
            ) : null}
          </>
        }
      />
      {revision.ok ? (
        <SheetEditor key={number} networkId={id} document={revision.document} revision={number} readOnly resultsCsvBase={null} />
      ) : (
        <Notice tone="error">
          Revision {number} no longer passes the network file's checks:
          <ul className="mt-2 list-disc pl-5">
            {revision.issues.map((issue) => (
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
