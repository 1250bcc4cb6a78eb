// Network writes shared by the pages and the API: every document is validated by the network
// file's schema before anything is stored (a draft with its problems), and every change is a
// numbered revision (an editing session's autosaves fold into one).
import type { Db } from "#db/database.ts";
import { insertNetwork, writeRevision, markNetworkDeleted, readRevision, readRevisionAsStored, readRevisionHeading, readRevisionText, restoreNetwork, RESTORE_WINDOW_DAYS } from "#db/networks.ts";
import type { NetworkRow, User } from "#db/schema.ts";
import { findTeam } from "#db/teams.ts";
import { revokeLinksOfNetwork } from "#db/shareLinks.ts";
import { auditNetworkDeletion } from "./audit.server.ts";
import { networkNameSchema } from "./fieldSchemas.ts";
import { validateDraft, validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import { isTrustedRevision, trustRevision } from "./compute/trustedRevisions.server.ts";

export type CreateResult = { ok: true; network: NetworkRow; document: Network } | { ok: false; issues: ValidationIssue[] };
export type SaveResult =
  | { ok: true; revision: number; document: Network; foldedSaves: number; problems: ValidationIssue[] }
  | { ok: false; reason: "invalid"; issues: ValidationIssue[] }
  | { ok: false; reason: "stale"; currentRevision: number | null };

export async function createNetwork(
  db: Db,
  input: { teamId: number; document: unknown; authorId: number; message?: string },
): Promise<CreateResult> {
  const checked = validateNetwork(input.document);
  if (!checked.ok) return { ok: false, issues: checked.issues };
  const network = await insertNetwork(db, {
    teamId: input.teamId,
    document: checked.network,
    authorId: input.authorId,
    message: input.message,
  });
  // Revision 1 is written with the network, so its creation time is the network's.
  trustRevision(network.id, network.current_revision, network.created_at);
  return { ok: true, network, document: checked.network };
}

/** The document without where its buses are drawn: what an engineering change changes. */
function withoutLayout(document: unknown): string {
  if (!document || typeof document !== "object") return JSON.stringify(document);
  const doc = document as { buses?: unknown };
  const buses = Array.isArray(doc.buses)
    ? doc.buses.map((bus) => (bus && typeof bus === "object" ? { ...(bus as object), x: undefined, y: undefined } : bus))
    : doc.buses;
  return JSON.stringify({ ...doc, buses });
}

/**
 * Save a document after `expectedRevision` if that is still current. A draft (the file's shape,
 * cross-element rules failing) is kept with its problems; only a wrong shape is refused. The
 * sheet's autosave passes `foldedSaves` so that one editing session stays one revision.
 */
export async function saveNetworkDocument(
  db: Db,
  input: { networkId: number; expectedRevision: number; document: unknown; authorId: number; message?: string; foldedSaves?: number },
): Promise<SaveResult> {
  const checked = validateDraft(input.document);
  if (!checked.ok) return { ok: false, reason: "invalid", issues: checked.issues };
  const next = JSON.stringify(checked.network);
  const nextEngineering = withoutLayout(checked.network);
  const result = await writeRevision(db, {
    networkId: input.networkId,
    expectedRevision: input.expectedRevision,
    document: checked.network,
    problems: checked.problems,
    authorId: input.authorId,
    message: input.message,
    foldedSaves: input.foldedSaves,
    layoutOnly: (previous) => JSON.stringify(previous) !== next && withoutLayout(previous) === nextEngineering,
  });
  if (!result.ok) return { ok: false, reason: "stale", currentRevision: result.currentRevision };
  // Only a complete network is trusted: a draft would fail the checks the pool then skips.
  if (!checked.problems.length) trustRevision(input.networkId, result.revision, result.savedAt);
  return { ok: true, revision: result.revision, foldedSaves: result.foldedSaves, document: checked.network, problems: checked.problems };
}

/** The current revision's document of a network, as stored (already validated when saved). */
export async function currentDocument(db: Db, network: NetworkRow) {
  const revision = await readRevision(db, network.id, network.current_revision);
  if (!revision) throw new Error(`Network ${network.id} has no revision ${network.current_revision}`);
  return revision;
}

/** What names one version of a network's document: its revision and its last save (autosaves fold into a revision). */
export function documentVersion(revision: number, savedAt: string): string {
  return `${revision}-${savedAt}`;
}

/** The current revision's author, message and save time, without reading its document. */
export async function currentRevisionHeading(db: Db, network: NetworkRow) {
  const heading = await readRevisionHeading(db, network.id, network.current_revision);
  if (!heading) throw new Error(`Network ${network.id} has no revision ${network.current_revision}`);
  return heading;
}

/**
 * The sheet's view of the current revision: its heading, and its document as stored, either as
 * text for the page (up to `inlineMaxChars`) or as the address the browser fetches it from
 * (routes/networks/document.ts). A large revision this process trusts is not even read here.
 */
export async function sheetRevision(db: Db, network: NetworkRow, inlineMaxChars: number) {
  const heading = await currentRevisionHeading(db, network);
  const documentUrl = `/networks/${network.id}/document?v=${encodeURIComponent(documentVersion(network.current_revision, heading.createdAt))}`;
  const large = heading.documentChars > inlineMaxChars;
  if (large && isTrustedRevision(network.id, network.current_revision, heading.createdAt)) return { heading, documentText: null, documentUrl, issues: [] };
  const checked = checkedDraftText(network, await currentRevisionAsStored(db, network));
  if (!checked.ok) return { heading, documentText: null, documentUrl: null, issues: checked.issues };
  return large ? { heading, documentText: null, documentUrl, issues: [] } : { heading, documentText: checked.text, documentUrl: null, issues: [] };
}

/** The current revision with its document as stored (JSON text): for pages that send it on unread. */
export async function currentRevisionAsStored(db: Db, network: NetworkRow) {
  const revision = await readRevisionAsStored(db, network.id, network.current_revision);
  if (!revision) throw new Error(`Network ${network.id} has no revision ${network.current_revision}`);
  return revision;
}

type StoredDocument = { document: unknown; createdAt: string };

/**
 * The stored revision's document as the network file's checks see it: a revision this process has
 * validated (on save, or before) is trusted as stored, with no second validation on each page
 * view; any other is validated now and trusted once it passes. `createdAt` is when the revision
 * was last saved, which names its version (an editing session folds saves into it).
 */
export function checkedRevision(network: NetworkRow, revision: StoredDocument): ReturnType<typeof validateNetwork> {
  if (isTrustedRevision(network.id, network.current_revision, revision.createdAt)) return { ok: true, network: revision.document as Network };
  const checked = validateNetwork(revision.document);
  if (checked.ok) trustRevision(network.id, network.current_revision, revision.createdAt);
  return checked;
}

/** As checkedRevision, for the sheet, which also opens a draft: its cross-element problems come back as `problems`. */
export function checkedDraft(network: NetworkRow, revision: StoredDocument): ReturnType<typeof validateDraft> {
  if (isTrustedRevision(network.id, network.current_revision, revision.createdAt)) return { ok: true, network: revision.document as Network, problems: [] };
  const checked = validateDraft(revision.document);
  if (checked.ok && !checked.problems.length) trustRevision(network.id, network.current_revision, revision.createdAt);
  return checked;
}

/**
 * As checkedDraft, for a page that sends the document on as JSON text: a revision this process
 * trusts is sent exactly as stored, neither parsed nor validated nor encoded again; any other is
 * read and checked now (once: it is trusted from then on when it passes) and sent as checked.
 */
export function checkedDraftText(
  network: NetworkRow,
  revision: { text: string; createdAt: string },
): { ok: true; text: string } | { ok: false; issues: ValidationIssue[] } {
  if (isTrustedRevision(network.id, network.current_revision, revision.createdAt)) return { ok: true, text: revision.text };
  let document: unknown;
  try {
    document = JSON.parse(revision.text);
  } catch {
    return { ok: false, issues: [{ path: "", message: "is not readable JSON" }] };
  }
  const checked = checkedDraft(network, { document, createdAt: revision.createdAt });
  return checked.ok ? { ok: true, text: JSON.stringify(checked.network) } : checked;
}

/**
 * The current revision as stored: its JSON text, unparsed, its bus count (read from the text; only
 * a bus has "nominalKV"), and whether this process has validated it with the current validator
 * (on save, or on a first solve), so the compute pool may trust it and skip the validation.
 */
export async function currentDocumentText(db: Db, network: NetworkRow): Promise<{ text: string; savedAt: string; buses: number; trusted: boolean }> {
  const stored = await readRevisionText(db, network.id, network.current_revision);
  if (stored === undefined) throw new Error(`Network ${network.id} has no revision ${network.current_revision}`);
  const { text, savedAt } = stored;
  let buses = 0;
  for (let at = text.indexOf('"nominalKV":'); at !== -1; at = text.indexOf('"nominalKV":', at + 12)) buses++;
  return { text, savedAt, buses, trusted: isTrustedRevision(network.id, network.current_revision, savedAt) };
}

/**
 * A rename is a new revision whose document carries the new name, so the list, the document and
 * the revision history never disagree. A concurrent save between our read and our write is
 * retried against the newer revision: a rename never needs the caller's revision.
 */
export async function renameNetwork(
  db: Db,
  input: { networkId: number; name: string; authorId: number },
): Promise<{ ok: true; revision: number } | { ok: false; error: string }> {
  const checked = networkNameSchema.safeParse(input.name);
  if (!checked.success) return { ok: false, error: checked.error.issues[0].message };
  const name = checked.data;
  for (let attempt = 0; attempt < 3; attempt++) {
    const row = await db
      .selectFrom("networks")
      .select("current_revision")
      .where("id", "=", input.networkId)
      .where("deleted_at", "is", null)
      .executeTakeFirst();
    if (!row) return { ok: false, error: "This network no longer exists." };
    const revision = await readRevision(db, input.networkId, row.current_revision);
    const document = { ...(revision?.document as object), name };
    const saved = await saveNetworkDocument(db, {
      networkId: input.networkId,
      expectedRevision: row.current_revision,
      document,
      authorId: input.authorId,
      message: `Renamed to "${name}"`,
    });
    if (saved.ok) return { ok: true, revision: saved.revision };
    if (saved.reason === "invalid")
      return { ok: false, error: `The stored document no longer validates: ${saved.issues[0]?.message ?? "unknown problem"}` };
  }
  return { ok: false, error: "The network kept changing while it was being renamed; try again." };
}

/** A stored revision (any number) of the network, or undefined when it has none by that number. */
export async function storedRevision(db: Db, network: NetworkRow, number: number) {
  return readRevision(db, network.id, number);
}

/** The name of the team a network belongs to ("" if the team is gone), for page headings. */
export async function teamNameOf(db: Db, network: NetworkRow): Promise<string> {
  return (await findTeam(db, network.team_id))?.name ?? "";
}

/**
 * Delete a network (restorable for RESTORE_WINDOW_DAYS) and write the line in its team's audit
 * log; the page and the API both delete through here. Answers until when it can be restored.
 */
export async function deleteNetwork(db: Db, input: { network: NetworkRow; by: User; now?: Date }): Promise<{ restorableUntil: string }> {
  const deletedAt = input.now ?? new Date();
  await markNetworkDeleted(db, input.network.id, input.by.id, deletedAt);
  await auditNetworkDeletion(db, { network: input.network, by: input.by, restored: false });
  return { restorableUntil: new Date(deletedAt.getTime() + RESTORE_WINDOW_DAYS * 86_400_000).toISOString() };
}

/**
 * Undo a deletion within its window, with its audit line; false when it is not deleted or too late.
 * The network's share links open again only when the person restoring says so (`reviveLinks`):
 * otherwise they are revoked, so a restore never silently hands access back to old link holders.
 */
export async function restoreDeletedNetwork(db: Db, input: { network: NetworkRow; by: User; reviveLinks: boolean; now?: Date }): Promise<boolean> {
  const now = input.now ?? new Date();
  const restored = await db.transaction().execute(async (trx) => {
    if (!(await restoreNetwork(trx, input.network.id, now))) return false;
    if (!input.reviveLinks) await revokeLinksOfNetwork(trx, input.network.id, input.by.id, now);
    return true;
  });
  if (!restored) return false;
  await auditNetworkDeletion(db, { network: input.network, by: input.by, restored: true });
  return true;
}
