// The revision history of a network: every editing session is a numbered revision with its
// author, time and message (its name); the documents themselves are read one at a time
// (networks.ts readRevision).
import type { Db } from "./database.ts";

export interface RevisionListing {
  number: number;
  createdAt: string;
  /** When the session's last folded save changed it; the creation time when none did. */
  savedAt: string;
  authorName: string | null;
  message: string;
  /** Autosaves folded into this revision after its first. */
  foldedSaves: number;
  /** How many problems it has as a draft; 0 for a complete network. */
  problemCount: number;
  issuedAt: string | null;
  issuedByName: string | null;
  /** Only where things are drawn changed, nothing of the engineering. */
  layoutOnly: boolean;
}

/** Newest first. */
export async function listRevisions(db: Db, networkId: number): Promise<RevisionListing[]> {
  const rows = await db
    .selectFrom("network_revisions as r")
    .leftJoin("users as u", "u.id", "r.author_id")
    .leftJoin("users as i", "i.id", "r.issued_by")
    .select([
      "r.number",
      "r.created_at as createdAt",
      "r.updated_at as updatedAt",
      "u.name as authorName",
      "r.message",
      "r.folded_saves as foldedSaves",
      "r.problems",
      "r.issued_at as issuedAt",
      "i.name as issuedByName",
      "r.layout_only as layoutOnly",
    ])
    .where("r.network_id", "=", networkId)
    .orderBy("r.number", "desc")
    .execute();
  return rows.map(({ updatedAt, problems, layoutOnly, ...row }) => ({
    ...row,
    savedAt: updatedAt ?? row.createdAt,
    problemCount: problems ? (JSON.parse(problems) as unknown[]).length : 0,
    layoutOnly: layoutOnly === 1,
  }));
}
