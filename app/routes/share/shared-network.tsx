// /s/:token — a share link. A view link opens the network read only for anyone holding it (sheet,
// readings, results, CSV, review notes, the study report). Someone signed in gets the link's role
// on that one network as a grant and goes to the network's own page; an edit link asks for an
// account first. A revoked or expired link shows only that it no longer works.
import { data, Link, redirect } from "react-router";
import type { Route } from "./+types/shared-network";
import { Notice } from "#app/components/Notice.tsx";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { ReviewNotesPanel } from "#app/components/review/ReviewNotesPanel.tsx";
import { SheetEditor } from "#app/components/sheet/SheetEditor.tsx";
import { getDb } from "#app/lib/db.server.ts";
import { formatDateTime } from "#app/lib/format.ts";
import { closedLinkAnswer } from "#app/lib/networkReader.server.ts";
import { checkedDraft, currentDocument } from "#app/lib/networks.server.ts";
import { grantedOrPageError, networkAccess } from "#app/lib/permissions.server.ts";
import { reviewNotesFor } from "#app/lib/reviewNotes.server.ts";
import { getSessionUser } from "#app/lib/session.server.ts";
import { grantFromLink, noteShareLinkUse, openShareLink, shareLinkActor } from "#app/lib/shareLinks.server.ts";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: data?.kind === "view" ? `${data.name} (shared) · Kilostep` : "Share link · Kilostep" },
  // The address is a secret: keep it out of search engines even if it leaks.
  { name: "robots", content: "noindex, nofollow" },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  const opened = await openShareLink(db, params.token);
  if (opened.state !== "live") {
    const closed = closedLinkAnswer(opened);
    return data({ kind: "closed" as const, title: closed.title, sentence: closed.sentence }, { status: closed.status });
  }
  const { link, network } = opened;
  const user = await getSessionUser(request);
  if (user) {
    await grantFromLink(db, link, user);
    await noteShareLinkUse(db, link, network, user);
    throw redirect(`/networks/${network.id}`);
  }
  const here = `/s/${params.token}`;
  if (link.role !== "viewer") return { kind: "sign-in" as const, back: here };

  await noteShareLinkUse(db, link, network, null);
  const actor = shareLinkActor(link);
  grantedOrPageError(await networkAccess(db, actor, network.id, "view"));
  const [revision, notes] = await Promise.all([
    currentDocument(db, network),
    reviewNotesFor(db, network.id, { userId: null, canView: true, canEdit: false, guestLinkId: link.id }),
  ]);
  // A draft opens as the owner's sheet opens it: read only, its problems in Checks and its
  // complete part solved. Only a document of the wrong shape is refused.
  const checked = checkedDraft(network, revision);
  return {
    kind: "view" as const,
    here,
    id: network.id,
    name: network.name,
    revision: { number: network.current_revision, savedAt: revision.createdAt, by: revision.authorName },
    expiresAt: link.expires_at,
    document: checked.ok ? checked.network : null,
    issues: checked.ok ? [] : checked.issues,
    problems: checked.ok ? checked.problems : [],
    notes,
  };
}

export default function SharedNetwork({ loaderData }: Route.ComponentProps) {
  if (loaderData.kind === "closed") {
    return (
      <section aria-labelledby="closed-title" className="panel max-w-2xl p-6">
        <PageTitle title={<span id="closed-title">{loaderData.title}</span>} />
        <p className="text-ink-soft">{loaderData.sentence}</p>
      </section>
    );
  }
  if (loaderData.kind === "sign-in") {
    const back = new URLSearchParams({ redirectTo: loaderData.back });
    return (
      <section aria-labelledby="edit-link-title" className="panel mx-auto max-w-xl p-6">
        <PageTitle title={<span id="edit-link-title">Sign in to edit</span>} />
        <p className="text-ink-soft">
          This link lets you change a network on Kilostep. Changes carry your name, so sign in first, or create an account; the
          network then opens for you to edit. The link gives access to that network only.
        </p>
        <div className="mt-5 flex flex-wrap gap-3">
          <Link to={`/sign-in?${back}`} className="btn btn-primary">
            Sign in
          </Link>
          <Link to={`/sign-up?${back}`} className="btn">
            Create an account
          </Link>
        </div>
      </section>
    );
  }
  const { here, id, name, revision, expiresAt, document, issues, problems, notes } = loaderData;
  return (
    <>
      <PageTitle
        title={name}
        lead={
          <>
            Shared with you to read <span className="role-badge">view only</span> · revision {revision.number}, saved{" "}
            {formatDateTime(revision.savedAt)}
            {revision.by ? ` by ${revision.by}` : ""}
            {expiresAt ? ` · this link works until ${formatDateTime(expiresAt)}` : ""}
            {problems.length ? ` · a draft with ${problems.length === 1 ? "one problem" : `${problems.length} problems`}, listed in Checks` : ""}
          </>
        }
        actions={
          <>
            <Link to={`${here}/study`} className="btn btn-small">
              Study
            </Link>
            <Link to={`${here}/report`} className="btn btn-small">
              Study report
            </Link>
          </>
        }
      />
      {document ? (
        <SheetEditor
          networkId={id}
          document={document}
          revision={revision.number}
          readOnly
          resultsCsvBase={here}
          aside={<ReviewNotesPanel {...notes} action={`${here}/notes`} signInBack={here} />}
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
