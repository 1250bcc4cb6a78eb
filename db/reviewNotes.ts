// Review notes: threads pinned to an element (or to the sheet) of a network, each a list of notes
// (the first note, then replies), resolved and reopened as a whole.
import type { Db } from "./database.ts";
import type { ReviewThreadRow } from "./schema.ts";

export interface ReviewNoteListing {
  id: number;
  authorName: string | null;
  authorId: number | null;
  /** Written through a view link by someone without an account, under the name they gave. */
  guest: boolean;
  body: string;
  createdAt: string;
}

export interface ReviewThreadListing {
  id: number;
  elementId: string | null;
  elementName: string | null;
  revision: number;
  createdAt: string;
  createdBy: number | null;
  createdByName: string | null;
  resolvedAt: string | null;
  resolvedByName: string | null;
  notes: ReviewNoteListing[];
}

/** Every thread of a network, open ones first, newest first within each. */
export async function listReviewThreads(db: Db, networkId: number): Promise<ReviewThreadListing[]> {
  const threads = await db
    .selectFrom("review_threads as t")
    .leftJoin("users as c", "c.id", "t.created_by")
    .leftJoin("users as r", "r.id", "t.resolved_by")
    .select([
      "t.id",
      "t.element_id",
      "t.element_name",
      "t.revision",
      "t.created_at",
      "t.created_by",
      "c.name as createdByName",
      "t.resolved_at",
      "r.name as resolvedByName",
    ])
    .where("t.network_id", "=", networkId)
    .orderBy("t.created_at", "desc")
    .orderBy("t.id", "desc")
    .execute();
  if (threads.length === 0) return [];
  const notes = await db
    .selectFrom("review_notes as n")
    .leftJoin("users as u", "u.id", "n.author_id")
    .select(["n.id", "n.thread_id", "n.author_id", "u.name as accountName", "n.guest_name", "n.body", "n.created_at"])
    .where(
      "n.thread_id",
      "in",
      threads.map((t) => t.id),
    )
    .orderBy("n.created_at")
    .orderBy("n.id")
    .execute();
  // One pass groups the notes by thread, so a long review stays linear.
  const notesOf = new Map<number, ReviewNoteListing[]>();
  for (const n of notes) {
    const listing = {
      id: n.id,
      authorId: n.author_id,
      authorName: n.accountName ?? n.guest_name,
      guest: n.guest_name !== null,
      body: n.body,
      createdAt: n.created_at,
    };
    const list = notesOf.get(n.thread_id);
    if (list) list.push(listing);
    else notesOf.set(n.thread_id, [listing]);
  }
  const listed = threads.map((t) => {
    const threadNotes = notesOf.get(t.id) ?? [];
    return {
      id: t.id,
      elementId: t.element_id,
      elementName: t.element_name,
      revision: t.revision,
      createdAt: t.created_at,
      createdBy: t.created_by,
      createdByName: t.createdByName ?? threadNotes[0]?.authorName ?? null,
      resolvedAt: t.resolved_at,
      resolvedByName: t.resolvedByName,
      notes: threadNotes,
    };
  });
  return [...listed.filter((t) => !t.resolvedAt), ...listed.filter((t) => t.resolvedAt)];
}

export async function findReviewThread(db: Db, threadId: number): Promise<ReviewThreadRow | undefined> {
  return db.selectFrom("review_threads").selectAll().where("id", "=", threadId).executeTakeFirst();
}

/** Who wrote a note: an account, or a view-link holder under the name they gave. */
export type NoteAuthorRecord = { userId: number } | { guestName: string; shareLinkId: number };

function authorColumns(author: NoteAuthorRecord) {
  return "userId" in author
    ? { author_id: author.userId, guest_name: null, share_link_id: null }
    : { author_id: null, guest_name: author.guestName, share_link_id: author.shareLinkId };
}

export async function insertReviewThread(
  db: Db,
  input: { networkId: number; elementId: string | null; elementName: string | null; revision: number; author: NoteAuthorRecord; body: string; now: Date },
): Promise<number> {
  return db.transaction().execute(async (trx) => {
    const at = input.now.toISOString();
    const thread = await trx
      .insertInto("review_threads")
      .values({
        network_id: input.networkId,
        element_id: input.elementId,
        element_name: input.elementName,
        revision: input.revision,
        created_by: "userId" in input.author ? input.author.userId : null,
        created_at: at,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await trx
      .insertInto("review_notes")
      .values({ thread_id: thread.id, ...authorColumns(input.author), body: input.body, created_at: at })
      .execute();
    return thread.id;
  });
}

export async function insertReviewReply(db: Db, input: { threadId: number; author: NoteAuthorRecord; body: string; now: Date }): Promise<void> {
  await db
    .insertInto("review_notes")
    .values({ thread_id: input.threadId, ...authorColumns(input.author), body: input.body, created_at: input.now.toISOString() })
    .execute();
}

export async function setThreadResolved(db: Db, threadId: number, resolvedBy: number | null, now: Date): Promise<void> {
  await db
    .updateTable("review_threads")
    .set(resolvedBy === null ? { resolved_at: null, resolved_by: null } : { resolved_at: now.toISOString(), resolved_by: resolvedBy })
    .where("id", "=", threadId)
    .execute();
}
