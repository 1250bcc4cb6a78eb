// Revisions as the pages and the API use them: a past revision's document checked by the
// network file's schema, the difference between two, and restoring one as a new revision.
import type { Db } from "#db/database.ts";
import { insertAuditEvent } from "#db/auditEvents.ts";
import { readRevision } from "#db/networks.ts";
import type { NetworkRow, User } from "#db/schema.ts";
import { listRevisions } from "#db/revisions.ts";
import { validateDraft, type Network, type ValidationIssue } from "#solver/schema.ts";
import { saveNetworkDocument } from "./networks.server.ts";
import { diffRevisions, type RevisionDiff } from "./revisionDiff.ts";

export type CheckedRevision =
  | { ok: true; number: number; createdAt: string; authorName: string | null; message: string; document: Network }
  | { ok: false; number: number; issues: ValidationIssue[] };

export async function checkedRevision(db: Db, networkId: number, number: number): Promise<CheckedRevision | undefined> {
  const revision = await readRevision(db, networkId, number);
  if (!revision) return undefined;
  // A draft is a revision like any other: it compares and restores.
  const checked = validateDraft(revision.document);
  if (!checked.ok) return { ok: false, number, issues: checked.issues };
  return { ok: true, number, createdAt: revision.createdAt, authorName: revision.authorName, message: revision.message, document: checked.network };
}

export async function compareRevisions(
  db: Db,
  networkId: number,
  fromNumber: number,
  toNumber: number,
): Promise<{ ok: true; diff: RevisionDiff } | { ok: false; error: string }> {
  const [from, to] = await Promise.all([checkedRevision(db, networkId, fromNumber), checkedRevision(db, networkId, toNumber)]);
  for (const [n, r] of [[fromNumber, from], [toNumber, to]] as const) {
    if (!r) return { ok: false, error: `There is no revision ${n}.` };
    if (!r.ok) return { ok: false, error: `Revision ${n} no longer passes the network file's checks, so it cannot be compared.` };
  }
  return { ok: true, diff: diffRevisions((from as { document: Network }).document, (to as { document: Network }).document) };
}

export type RestoreOutcome = { ok: true; revision: number } | { ok: false; status: 404 | 409 | 422; error: string };

/** Saves revision `number`'s document as the next revision; nothing is overwritten. */
export async function restoreRevision(db: Db, input: { network: NetworkRow; number: number; by: User }): Promise<RestoreOutcome> {
  const revision = await checkedRevision(db, input.network.id, input.number);
  if (!revision) return { ok: false, status: 404, error: `There is no revision ${input.number}.` };
  if (!revision.ok) return { ok: false, status: 422, error: `Revision ${input.number} no longer passes the network file's checks, so it cannot be restored.` };
  if (input.number === input.network.current_revision) return { ok: false, status: 409, error: `Revision ${input.number} is already the current one.` };
  const saved = await saveNetworkDocument(db, {
    networkId: input.network.id,
    expectedRevision: input.network.current_revision,
    document: revision.document,
    authorId: input.by.id,
    message: `Restored revision ${input.number}`,
  });
  if (!saved.ok) {
    return saved.reason === "stale"
      ? { ok: false, status: 409, error: "Someone saved this network a moment ago; look at the newest revision, then restore again if you still want to." }
      : { ok: false, status: 422, error: `Revision ${input.number} no longer passes the network file's checks, so it cannot be restored.` };
  }
  await insertAuditEvent(db, {
    teamId: input.network.team_id,
    kind: "revision-restored",
    actorId: input.by.id,
    networkId: input.network.id,
    summary: `${input.by.name} restored revision ${input.number} of "${input.network.name}" as revision ${saved.revision}.`,
  });
  return { ok: true, revision: saved.revision };
}

/** Every saved revision of a network, newest first: number, time, author and message. */
export async function revisionHistory(db: Db, networkId: number) {
  return listRevisions(db, networkId);
}
