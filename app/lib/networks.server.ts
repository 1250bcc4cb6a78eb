// Network writes shared by the pages and the API: every document is validated by the network
// file's schema before anything is stored, and every change is a new numbered revision.
import type { Db } from "#db/database.ts";
import { appendRevision, insertNetwork, readRevision } from "#db/networks.ts";
import type { NetworkRow } from "#db/schema.ts";
import { NETWORK_NAME_MAX } from "./forms.ts";
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";

export type CreateResult = { ok: true; network: NetworkRow; document: Network } | { ok: false; issues: ValidationIssue[] };
export type SaveResult =
  | { ok: true; revision: number }
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
  return { ok: true, network, document: checked.network };
}

/** Save a document as the next revision if `expectedRevision` is still current. */
export async function saveNetworkDocument(
  db: Db,
  input: { networkId: number; expectedRevision: number; document: unknown; authorId: number; message?: string },
): Promise<SaveResult> {
  const checked = validateNetwork(input.document);
  if (!checked.ok) return { ok: false, reason: "invalid", issues: checked.issues };
  const result = await appendRevision(db, {
    networkId: input.networkId,
    expectedRevision: input.expectedRevision,
    document: checked.network,
    authorId: input.authorId,
    message: input.message,
  });
  return result.ok ? result : { ok: false, reason: "stale", currentRevision: result.currentRevision };
}

/** The current revision's document of a network, as stored (already validated when saved). */
export async function currentDocument(db: Db, network: NetworkRow) {
  const revision = await readRevision(db, network.id, network.current_revision);
  if (!revision) throw new Error(`Network ${network.id} has no revision ${network.current_revision}`);
  return revision;
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
  const name = input.name.trim();
  if (name.length === 0) return { ok: false, error: "Give the network a name." };
  if (name.length > NETWORK_NAME_MAX) return { ok: false, error: `A name may have at most ${NETWORK_NAME_MAX} characters.` };
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
    if (saved.ok) return saved;
    if (saved.reason === "invalid")
      return { ok: false, error: `The stored document no longer validates: ${saved.issues[0]?.message ?? "unknown problem"}` };
  }
  return { ok: false, error: "The network kept changing while it was being renamed; try again." };
}
