// Networks and their revisions. Writers go through appendRevision, a compare-and-swap on the
// network's current revision, so a stale writer is told so and nothing of theirs is stored.
import type { Network } from "#solver/schema.ts";
import type { Db } from "./database.ts";
import type { NetworkRow, TeamRole } from "./schema.ts";

/** A deleted network can be restored for this long; after that it is purged. */
export const RESTORE_WINDOW_DAYS = 30;

export interface NetworkListing {
  id: number;
  name: string;
  teamId: number;
  teamName: string;
  role: TeamRole;
  revision: number;
  updatedAt: string;
  updatedByName: string | null;
}

export interface DeletedNetworkListing {
  id: number;
  name: string;
  teamId: number;
  teamName: string;
  role: TeamRole;
  deletedAt: string;
  deletedByName: string | null;
  restorableUntil: string;
}

function restoreCutoff(now: Date): string {
  return new Date(now.getTime() - RESTORE_WINDOW_DAYS * 86_400_000).toISOString();
}

/** Live networks of every team the user belongs to, most recently changed first. */
export async function listNetworksForUser(db: Db, userId: number): Promise<NetworkListing[]> {
  return db
    .selectFrom("networks as n")
    .innerJoin("teams as t", "t.id", "n.team_id")
    .innerJoin("memberships as m", (join) => join.onRef("m.team_id", "=", "n.team_id").on("m.user_id", "=", userId))
    .leftJoin("users as u", "u.id", "n.updated_by")
    .select([
      "n.id",
      "n.name",
      "t.id as teamId",
      "t.name as teamName",
      "m.role",
      "n.current_revision as revision",
      "n.updated_at as updatedAt",
      "u.name as updatedByName",
    ])
    .where("n.deleted_at", "is", null)
    .orderBy("n.updated_at", "desc")
    .orderBy("n.id", "desc")
    .execute();
}

/** Deleted networks of the user's teams that are still within the restore window. */
export async function listDeletedNetworksForUser(db: Db, userId: number, now = new Date()): Promise<DeletedNetworkListing[]> {
  const rows = await db
    .selectFrom("networks as n")
    .innerJoin("teams as t", "t.id", "n.team_id")
    .innerJoin("memberships as m", (join) => join.onRef("m.team_id", "=", "n.team_id").on("m.user_id", "=", userId))
    .leftJoin("users as u", "u.id", "n.deleted_by")
    .select([
      "n.id",
      "n.name",
      "t.id as teamId",
      "t.name as teamName",
      "m.role",
      "n.deleted_at as deletedAt",
      "u.name as deletedByName",
    ])
    .where("n.deleted_at", "is not", null)
    .where("n.deleted_at", ">", restoreCutoff(now))
    .orderBy("n.deleted_at", "desc")
    .execute();
  return rows.map((r) => {
    const deletedAt = r.deletedAt as string;
    return {
      ...r,
      deletedAt,
      restorableUntil: new Date(new Date(deletedAt).getTime() + RESTORE_WINDOW_DAYS * 86_400_000).toISOString(),
    };
  });
}

export async function findNetwork(db: Db, networkId: number): Promise<NetworkRow | undefined> {
  return db.selectFrom("networks").selectAll().where("id", "=", networkId).executeTakeFirst();
}

/** The stored document of one revision, parsed; undefined when there is no such revision. */
/** A revision's author, message, editing session and document length in characters, without reading its document. */
export async function readRevisionHeading(
  db: Db,
  networkId: number,
  number: number,
): Promise<{ createdAt: string; authorName: string | null; message: string; foldedSaves: number; documentChars: number } | undefined> {
  const row = await db
    .selectFrom("network_revisions as r")
    .leftJoin("users as u", "u.id", "r.author_id")
    .select((eb) => ["r.created_at", "r.updated_at", "r.message", "r.folded_saves", "u.name as authorName", eb.fn<number>("length", ["r.document"]).as("documentChars")])
    .where("r.network_id", "=", networkId)
    .where("r.number", "=", number)
    .executeTakeFirst();
  return row && { createdAt: row.updated_at ?? row.created_at, authorName: row.authorName, message: row.message, foldedSaves: row.folded_saves, documentChars: row.documentChars };
}

/** A revision with its document as stored (JSON text, not parsed), its author's name and its editing session. */
export async function readRevisionAsStored(
  db: Db,
  networkId: number,
  number: number,
): Promise<
  | { text: string; createdAt: string; authorName: string | null; message: string; foldedSaves: number; problems: { path: string; message: string }[] }
  | undefined
> {
  const row = await db
    .selectFrom("network_revisions as r")
    .leftJoin("users as u", "u.id", "r.author_id")
    .select(["r.document", "r.created_at", "r.updated_at", "r.message", "r.folded_saves", "r.problems", "u.name as authorName"])
    .where("r.network_id", "=", networkId)
    .where("r.number", "=", number)
    .executeTakeFirst();
  if (!row) return undefined;
  return {
    text: row.document,
    createdAt: row.updated_at ?? row.created_at,
    authorName: row.authorName,
    message: row.message,
    foldedSaves: row.folded_saves,
    problems: row.problems ? JSON.parse(row.problems) : [],
  };
}

export async function readRevision(
  db: Db,
  networkId: number,
  number: number,
): Promise<
  | { document: unknown; createdAt: string; authorName: string | null; message: string; foldedSaves: number; problems: { path: string; message: string }[] }
  | undefined
> {
  const stored = await readRevisionAsStored(db, networkId, number);
  if (!stored) return undefined;
  const { text, ...rest } = stored;
  return { document: JSON.parse(text), ...rest };
}

export async function readRevisionText(db: Db, networkId: number, number: number): Promise<{ text: string; savedAt: string } | undefined> {
  const row = await db
    .selectFrom("network_revisions")
    .select(["document", "created_at", "updated_at"])
    .where("network_id", "=", networkId)
    .where("number", "=", number)
    .executeTakeFirst();
  return row && { text: row.document, savedAt: row.updated_at ?? row.created_at };
}

/** A new network whose revision 1 is the given validated document; its name is the document's. */
export async function insertNetwork(
  db: Db,
  input: { teamId: number; document: Network; authorId: number; message?: string },
): Promise<NetworkRow> {
  return db.transaction().execute(async (trx) => {
    const now = new Date().toISOString();
    const network = await trx
      .insertInto("networks")
      .values({
        team_id: input.teamId,
        name: input.document.name,
        current_revision: 1,
        created_at: now,
        updated_at: now,
        updated_by: input.authorId,
      })
      .returningAll()
      .executeTakeFirstOrThrow();
    await trx
      .insertInto("network_revisions")
      .values({
        network_id: network.id,
        number: 1,
        document: JSON.stringify(input.document),
        author_id: input.authorId,
        created_at: now,
        message: input.message ?? "Created",
      })
      .execute();
    return network;
  });
}

/** Autosaves further apart than this start a new editing session, and so a new revision. */
export const EDITING_SESSION_GAP_MS = 30 * 60_000;

export type SaveOutcome =
  /** `savedAt` names this version of the revision (its creation, or the save folded into it). */
  | { ok: true; revision: number; foldedSaves: number; savedAt: string }
  | { ok: false; currentRevision: number | null };

export interface RevisionWrite {
  networkId: number;
  expectedRevision: number;
  document: Network;
  /** A draft's problems; empty for a complete network. */
  problems: { path: string; message: string }[];
  authorId: number;
  message?: string;
  /**
   * The sheet's autosave sends how many saves it knows are folded into `expectedRevision`; only
   * then may this save fold into it, and a different count means someone saved in between.
   */
  foldedSaves?: number;
  /** Whether `document` differs from an earlier stored document only in where things are drawn. */
  layoutOnly(previousDocument: unknown): boolean;
  now?: Date;
}

/**
 * Store `document` after `expectedRevision`, but only if that is still the current one (a
 * compare-and-swap: a stale writer is told the current revision and nothing of theirs is stored).
 * An autosave of the same author's open editing session (no message, not issued, saved within
 * the session gap) folds into that revision instead of adding one.
 */
export async function writeRevision(db: Db, input: RevisionWrite): Promise<SaveOutcome> {
  return db.transaction().execute(async (trx) => {
    const now = input.now ?? new Date();
    const stamp = now.toISOString();
    const network = await trx
      .selectFrom("networks")
      .select("current_revision")
      .where("id", "=", input.networkId)
      .where("deleted_at", "is", null)
      .executeTakeFirst();
    if (!network) return { ok: false, currentRevision: null };
    if (network.current_revision !== input.expectedRevision) return { ok: false, currentRevision: network.current_revision };
    const current = await trx
      .selectFrom("network_revisions")
      .select(["id", "document", "author_id", "message", "issued_at", "folded_saves", "created_at", "updated_at"])
      .where("network_id", "=", input.networkId)
      .where("number", "=", input.expectedRevision)
      .executeTakeFirstOrThrow();
    if (input.foldedSaves !== undefined && input.foldedSaves !== current.folded_saves)
      return { ok: false, currentRevision: network.current_revision };
    const problems = input.problems.length ? JSON.stringify(input.problems) : null;
    const lastChange = Date.parse(current.updated_at ?? current.created_at);
    const fold =
      input.foldedSaves !== undefined &&
      input.message === undefined &&
      current.author_id === input.authorId &&
      current.message === "" &&
      current.issued_at === null &&
      input.expectedRevision > 1 &&
      now.getTime() - lastChange < EDITING_SESSION_GAP_MS;
    await trx
      .updateTable("networks")
      .set({ current_revision: fold ? input.expectedRevision : input.expectedRevision + 1, name: input.document.name, updated_at: stamp, updated_by: input.authorId })
      .where("id", "=", input.networkId)
      .execute();
    if (fold) {
      const before = await trx
        .selectFrom("network_revisions")
        .select("document")
        .where("network_id", "=", input.networkId)
        .where("number", "=", input.expectedRevision - 1)
        .executeTakeFirst();
      await trx
        .updateTable("network_revisions")
        .set({
          document: JSON.stringify(input.document),
          problems,
          folded_saves: current.folded_saves + 1,
          updated_at: stamp,
          layout_only: before && input.layoutOnly(JSON.parse(before.document)) ? 1 : 0,
        })
        .where("id", "=", current.id)
        .execute();
      return { ok: true, revision: input.expectedRevision, foldedSaves: current.folded_saves + 1, savedAt: stamp };
    }
    const next = input.expectedRevision + 1;
    await trx
      .insertInto("network_revisions")
      .values({
        network_id: input.networkId,
        number: next,
        document: JSON.stringify(input.document),
        author_id: input.authorId,
        created_at: stamp,
        message: input.message ?? "",
        problems,
        layout_only: input.layoutOnly(JSON.parse(current.document)) ? 1 : 0,
      })
      .execute();
    return { ok: true, revision: next, foldedSaves: 0, savedAt: stamp };
  });
}

/** Give a revision a name (its message); a named revision closes its editing session. */
export async function nameRevision(db: Db, networkId: number, number: number, message: string): Promise<boolean> {
  const result = await db
    .updateTable("network_revisions")
    .set({ message })
    .where("network_id", "=", networkId)
    .where("number", "=", number)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** Mark a revision issued (sent out as the basis of a decision); it stays issued. */
export async function markRevisionIssued(db: Db, networkId: number, number: number, userId: number, now = new Date()): Promise<boolean> {
  const result = await db
    .updateTable("network_revisions")
    .set({ issued_at: now.toISOString(), issued_by: userId })
    .where("network_id", "=", networkId)
    .where("number", "=", number)
    .where("issued_at", "is", null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function markNetworkDeleted(db: Db, networkId: number, userId: number, now = new Date()): Promise<void> {
  await db
    .updateTable("networks")
    .set({ deleted_at: now.toISOString(), deleted_by: userId })
    .where("id", "=", networkId)
    .where("deleted_at", "is", null)
    .execute();
}

/** Bring a deleted network back; false when it is not deleted or its restore window has passed. */
export async function restoreNetwork(db: Db, networkId: number, now = new Date()): Promise<boolean> {
  const result = await db
    .updateTable("networks")
    .set({ deleted_at: null, deleted_by: null })
    .where("id", "=", networkId)
    .where("deleted_at", "is not", null)
    .where("deleted_at", ">", restoreCutoff(now))
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** Networks deleted longer ago than the restore window go for good, revisions and all. */
export async function purgeExpiredDeletions(db: Db, now = new Date()): Promise<number> {
  const result = await db
    .deleteFrom("networks")
    .where("deleted_at", "is not", null)
    .where("deleted_at", "<=", restoreCutoff(now))
    .executeTakeFirst();
  return Number(result.numDeletedRows);
}
