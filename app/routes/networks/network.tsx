import { Link } from "react-router";
import type { Route } from "./+types/network";
import { ReviewNotesPanel } from "#app/components/review/ReviewNotesPanel.tsx";
import type { FullWindowHandle } from "#app/components/AppShell.tsx";
import { SheetEditor } from "#app/components/sheet/SheetEditor.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { teamEquipmentTypes } from "#app/lib/library.server.ts";
import { checkedDraft, currentDocument, teamNameOf } from "#app/lib/networks.server.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { reviewNotesFor } from "#app/lib/reviewNotes.server.ts";

/** The sheet takes the window under a slim header (AppShell). */
export const handle: FullWindowHandle = { fullWindow: true };

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, user, network, role } = await requireNetwork(request, params, "view");
  const [revision, teamName, notes] = await Promise.all([
    currentDocument(db, network),
    teamNameOf(db, network),
    reviewNotesFor(db, network.id, { userId: user.id, canView: true, canEdit: roleAllows(role, "edit") }),
  ]);
  const library = await teamEquipmentTypes(db, { id: network.team_id, name: teamName });
  // A draft opens as it was left; its problems are the sheet's Checks.
  const checked = checkedDraft(network, revision);
  return {
    id: network.id,
    name: network.name,
    team: { id: network.team_id, name: teamName },
    role,
    mayShare: roleAllows(role, "share"),
    notes,
    library,
    revision: { number: network.current_revision, foldedSaves: revision.foldedSaves, message: revision.message },
    document: checked.ok ? checked.network : null,
    issues: checked.ok ? [] : checked.issues,
  };
}

export default function NetworkPage({ loaderData }: Route.ComponentProps) {
  const { id, name, team, role, revision, document, issues, notes, mayShare, library } = loaderData;
  const head = (
    <>
      <Link to="/networks" className="ks-head-back">
        ← Networks
      </Link>
      <h1 className="ks-head-title">{name}</h1>
      <p className="ks-head-meta">
        <Link to={`/teams/${team.id}`}>{team.name}</Link>
        <span className="ks-head-role">
          {" "}
          · your role <span className="role-badge">{role}</span>
        </span>
      </p>
      <nav className="ks-head-links" aria-label="This network">
        <Link to={`/networks/${id}/study`}>Study</Link>
        <Link to={`/networks/${id}/cases`}>Operating cases</Link>
        <Link to={`/networks/${id}/ladder`}>Voltage ladder</Link>
        <Link to={`/networks/${id}/report`}>Study report</Link>
        {role !== "viewer" ? <Link to={`/networks/${id}/loads-import`}>Import loads</Link> : null}
        <a href={`/api/networks/${id}/export`} download>
          Download network file
        </a>
        <Link to={`/networks/${id}/revisions`}>Revisions</Link>
        {mayShare ? <Link to={`/networks/${id}/share`}>Share</Link> : null}
      </nav>
    </>
  );
  return (
    <>
      {document ? (
        <SheetEditor
          networkId={id}
          document={document}
          revision={revision.number}
          foldedSaves={revision.foldedSaves}
          readOnly={role === "viewer"}
          library={library}
          head={head}
          aside={<ReviewNotesPanel {...notes} action={`/networks/${id}/notes`} signInBack={`/networks/${id}`} />}
        />
      ) : (
        <div className="p-4">
          <h1 className="mb-3 text-2xl">{name}</h1>
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
        </div>
      )}
    </>
  );
}
