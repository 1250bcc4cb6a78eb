import { useEffect, useMemo, useState } from "react";
import { Link } from "react-router";
import type { Network } from "#solver/schema.ts";
import type { Route } from "./+types/network";
import { ReviewNotesPanel } from "#app/components/review/ReviewNotesPanel.tsx";
import type { FullWindowHandle } from "#app/components/AppShell.tsx";
import { SheetEditor } from "#app/components/sheet/SheetEditor.tsx";
import { Notice } from "#app/components/Notice.tsx";
import { requireNetwork } from "#app/lib/access.server.ts";
import { teamEquipmentTypes } from "#app/lib/library.server.ts";
import { sheetRevision, teamNameOf } from "#app/lib/networks.server.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { reviewNotesFor } from "#app/lib/reviewNotes.server.ts";

/** Past this size (about 1,000 buses) the document is not put in the page but fetched by the browser. */
const INLINE_DOCUMENT_MAX_CHARS = 400_000;

type FetchedDocument = { kind: "none" } | { kind: "reading" } | { kind: "read"; document: Network } | { kind: "failed"; reason: string };

/** The document at `url`, fetched once the page is in the browser (a plain GET, which the browser may keep). */
function useFetchedDocument(url: string | null): FetchedDocument {
  const [state, setState] = useState<FetchedDocument>({ kind: url ? "reading" : "none" });
  useEffect(() => {
    if (!url) return setState({ kind: "none" });
    const controller = new AbortController();
    setState({ kind: "reading" });
    fetch(url, { signal: controller.signal, credentials: "same-origin" })
      .then(async (response) => {
        if (!response.ok) throw new Error(`the server answered ${response.status}`);
        setState({ kind: "read", document: (await response.json()) as Network });
      })
      .catch((failure: unknown) => {
        if (!controller.signal.aborted) setState({ kind: "failed", reason: failure instanceof Error ? failure.message : String(failure) });
      });
    return () => controller.abort();
  }, [url]);
  return state;
}

/** The sheet takes the window under a slim header (AppShell). */
export const handle: FullWindowHandle = { fullWindow: true };

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.name ?? "Network"} · Kilostep` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, user, network, role } = await requireNetwork(request, params, "view");
  const [revision, teamName, notes] = await Promise.all([
    sheetRevision(db, network, INLINE_DOCUMENT_MAX_CHARS),
    teamNameOf(db, network),
    reviewNotesFor(db, network.id, { userId: user.id, canView: true, canEdit: roleAllows(role, "edit") }),
  ]);
  const library = await teamEquipmentTypes(db, { id: network.team_id, name: teamName });
  // A draft opens as it was left; its problems are the sheet's Checks. The document goes to the
  // browser as the JSON text it is stored as, inside the page while it is small; a large one is
  // fetched by the browser from its own address (routes/networks/document.ts), as stored, which it
  // may keep: escaped into the page, megabytes of JSON cost seconds to write and to read.
  return {
    id: network.id,
    name: network.name,
    team: { id: network.team_id, name: teamName },
    role,
    mayShare: roleAllows(role, "share"),
    notes,
    library,
    revision: { number: network.current_revision, foldedSaves: revision.heading.foldedSaves, message: revision.heading.message },
    documentText: revision.documentText,
    documentUrl: revision.documentUrl,
    documentChars: revision.heading.documentChars,
    issues: revision.issues,
  };
}

export default function NetworkPage({ loaderData }: Route.ComponentProps) {
  const { id, name, team, role, revision, documentText, documentUrl, documentChars, issues, notes, mayShare, library } = loaderData;
  // A large drawing is built in the browser only, from its document fetched as stored (see the loader).
  const inline = useMemo(() => (documentText === null ? null : (JSON.parse(documentText) as Network)), [documentText]);
  const fetched = useFetchedDocument(documentUrl);
  const document = inline ?? (fetched.kind === "read" ? fetched.document : null);
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
  if (documentUrl !== null && !document) {
    return (
      <div className="ks-editor ks-editor-full">
        <header className="ks-head">{head}</header>
        {fetched.kind === "failed" ? (
          <div className="p-4">
            <Notice tone="error">
              The drawing could not be fetched ({fetched.reason}). <a href={`/networks/${id}`}>Try again</a>.
            </Notice>
          </div>
        ) : (
          <p className="p-4" role="status">
            Opening the drawing ({Math.round(documentChars / 1000).toLocaleString("en-GB")} kB)…
          </p>
        )}
      </div>
    );
  }
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
