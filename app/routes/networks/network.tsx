import { Link } from "react-router";
import type { Route } from "./+types/network";
import { ReviewNotesPanel } from "#app/components/review/ReviewNotesPanel.tsx";
import { SheetEditor } from "#app/components/sheet/SheetEditor.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { teamEquipmentTypes } from "#app/lib/library.server.ts";
import { currentDocument, teamNameOf, checkedRevision } from "#app/lib/networks.server.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { reviewNotesFor } from "#app/lib/reviewNotes.server.ts";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, user, network, role } = await requireNetwork(request, params, "view");
  const [revision, teamName, notes] = await Promise.all([
    currentDocument(db, network),
    teamNameOf(db, network),
    reviewNotesFor(db, network.id, { userId: user.id, canView: true, canEdit: roleAllows(role, "edit") }),
  ]);
  const library = await teamEquipmentTypes(db, { id: network.team_id, name: teamName });
  const checked = checkedRevision(network, revision.document);
  return {
    id: network.id,
    name: network.name,
    team: { id: network.team_id, name: teamName },
    role,
    mayShare: roleAllows(role, "share"),
    notes,
    library,
    revision: { number: network.current_revision, savedAt: revision.createdAt, by: revision.authorName, message: revision.message },
    document: checked.ok ? checked.network : null,
    issues: checked.ok ? [] : checked.issues,
  };
}

export default function NetworkPage({ loaderData }: Route.ComponentProps) {
  const { id, name, team, role, revision, document, issues, notes, mayShare, library } = loaderData;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to="/networks">← Networks</Link>
      </p>
      <PageTitle
        title={name}
        lead={
          <>
            <Link to={`/teams/${team.id}`}>{team.name}</Link> · your role <span className="role-badge">{role}</span> ·
            revision {revision.number}, saved {formatDateTime(revision.savedAt)}
            {revision.by ? ` by ${revision.by}` : ""}
          </>
        }
        actions={
          <>
            <Link to={`/networks/${id}/ladder`} className="btn btn-small">
              Voltage ladder
            </Link>
            <Link to={`/networks/${id}/report`} className="btn btn-small">
              Study report
            </Link>
            {role !== "viewer" ? (
              <Link to={`/networks/${id}/loads-import`} className="btn btn-small">
                Import loads
              </Link>
            ) : null}
            <a href={`/api/networks/${id}/export`} className="btn btn-small" download>
              Download network file
            </a>
            <Link to={`/networks/${id}/revisions`} className="btn btn-small">
              Revisions
            </Link>
            {mayShare ? (
              <Link to={`/networks/${id}/share`} className="btn btn-small">
                Share
              </Link>
            ) : null}
          </>
        }
      />
      {document ? (
        <SheetEditor
          networkId={id}
          document={document}
          revision={revision.number}
          readOnly={role === "viewer"}
          library={library}
          aside={<ReviewNotesPanel {...notes} action={`/networks/${id}/notes`} signInBack={`/networks/${id}`} />}
        />
      ) : (
        <Notice tone="error">
          This revision no longer passes the network file's checks:
          <ul className="mt-2 list-disc pl-5">
            {issues.map((issue) => (
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
