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

export type AppendResult = { ok: true; revision: number } | { ok: false; currentRevision: number | null };

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
export async function readRevision(
  db: Db,
  networkId: number,
  number: number,
): Promise<{ document: unknown; createdAt: string; authorName: string | null; message: string } | undefined> {
  const row = await db
    .selectFrom("network_revisions as r")
    .leftJoin("users as u", "u.id", "r.author_id")
    .select(["r.document", "r.created_at", "r.message", "u.name as authorName"])
    .where("r.network_id", "=", networkId)
    .where("r.number", "=", number)
    .executeTakeFirst();
  if (!row) return undefined;
  return { document: JSON.parse(row.document), createdAt: row.created_at, authorName: row.authorName, message: row.message };
}

/** The stored document of one revision as its JSON text, unparsed (for the compute pool to parse off the request thread). */
export async function readRevisionText(db: Db, networkId: number, number: number): Promise<string | undefined> {
  const row = await db
    .selectFrom("network_revisions")
    .select("document")
    .where("network_id", "=", networkId)
    .where("number", "=", number)
    .executeTakeFirst();
  return row?.document;
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

/**
 * Store `document` as the revision after `expectedRevision`, but only if that is still the
 * current one. The guarded UPDATE comes first so the write lock is taken before anything is
 * read; if it matches no row, nothing was written and the caller learns the current revision.
 */
export async function appendRevision(
  db: Db,
  input: { networkId: number; expectedRevision: number; document: Network; authorId: number; message?: string },
): Promise<AppendResult> {
  return db.transaction().execute(async (trx) => {
    const now = new Date().toISOString();
    const next = input.expectedRevision + 1;
    const updated = await trx
      .updateTable("networks")
      .set({ current_revision: next, name: input.document.name, updated_at: now, updated_by: input.authorId })
      .where("id", "=", input.networkId)
      .where("current_revision", "=", input.expectedRevision)
      .where("deleted_at", "is", null)
      .executeTakeFirst();
    if (Number(updated.numUpdatedRows) !== 1) {
      const current = await trx
        .selectFrom("networks")
        .select("current_revision")
        .where("id", "=", input.networkId)
        .where("deleted_at", "is", null)
        .executeTakeFirst();
      return { ok: false, currentRevision: current?.current_revision ?? null };
    }
    await trx
      .insertInto("network_revisions")
      .values({
        network_id: input.networkId,
        number: next,
        document: JSON.stringify(input.document),
        author_id: input.authorId,
        created_at: now,
        message: input.message ?? "",
      })
      .execute();
    return { ok: true, revision: next };
  });
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
