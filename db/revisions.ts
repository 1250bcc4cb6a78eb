// The revision history of a network: every save is a numbered revision with its author, time and
// message; the documents themselves are read one at a time (networks.ts readRevision).
import type { Db } from "./database.ts";

export interface RevisionListing {
  number: number;
  createdAt: string;
  authorName: string | null;
  message: string;
}

/** Newest first. */
export async function listRevisions(db: Db, networkId: number): Promise<RevisionListing[]> {
  return db
    .selectFrom("network_revisions as r")
    .leftJoin("users as u", "u.id", "r.author_id")
    .select(["r.number", "r.created_at as createdAt", "u.name as authorName", "r.message"])
    .where("r.network_id", "=", networkId)
    .orderBy("r.number", "desc")
    .execute();
}
