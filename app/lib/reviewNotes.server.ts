// Writing review notes: a new thread pinned to an element or to the sheet, replies, resolve and
// reopen. Callers have already asked the permissions module for view access; the note rules on
// top of that are in reviewNotePermissions.ts. The team's owners hear of each new note by mail
// unless they turned it off.
import type { Db } from "#db/database.ts";
import type { NetworkRow, User } from "#db/schema.ts";
import {
  findReviewThread,
  insertReviewReply,
  insertReviewThread,
  listReviewThreads,
  setThreadResolved,
  type NoteAuthorRecord,
  type ReviewThreadListing,
} from "#db/reviewNotes.ts";
import { ownersWantingNoteMail } from "#db/userSettings.ts";
import type { Network } from "#solver/schema.ts";
import { publicUrl } from "./env.server.ts";
import { sendMailInBackground } from "./mail.server.ts";
import { reviewNoteMail } from "./mailMessages.ts";
import { describeElement, findElement } from "./networkElements.ts";
import { checkGuestName, checkNoteBody, mayResolveThread, mayWriteNotes, type NoteReader } from "./reviewNotePermissions.ts";

export type NoteOutcome = { ok: true; message: string; threadId: number } | { ok: false; status: 400 | 401 | 403 | 404; error: string };

const ACCOUNT_NEEDED = "Writing review notes needs an account: sign in or create one, then open the link again.";

/** Who is writing: a signed-in person, or someone holding a view link without an account, under the name they give. */
export type NoteWriter = { user: User } | { guest: { name: unknown; linkId: number } };

interface NoteAuthor {
  record: NoteAuthorRecord;
  /** As the owners' mail names them. */
  name: string;
  userId: number | null;
}

function authorOf(reader: NoteReader, writer: NoteWriter): { ok: true; author: NoteAuthor } | { ok: false; outcome: NoteOutcome } {
  if (!mayWriteNotes(reader)) {
    const outcome: NoteOutcome =
      reader.userId === null ? { ok: false, status: 401, error: ACCOUNT_NEEDED } : { ok: false, status: 403, error: "You cannot write review notes on this network." };
    return { ok: false, outcome };
  }
  if ("user" in writer) return { ok: true, author: { record: { userId: writer.user.id }, name: writer.user.name, userId: writer.user.id } };
  const name = checkGuestName(writer.guest.name);
  if (!name.ok) return { ok: false, outcome: { ok: false, status: 400, error: name.error } };
  return {
    ok: true,
    author: { record: { guestName: name.name, shareLinkId: writer.guest.linkId }, name: `${name.name} (no account, view link #${writer.guest.linkId})`, userId: null },
  };
}

function notifyOwners(
  db: Db,
  input: { network: NetworkRow; author: NoteAuthor; pinnedTo: string; body: string; reply: boolean },
): Promise<void> {
  return ownersWantingNoteMail(db, input.network.team_id, input.author.userId).then((owners) => {
    for (const owner of owners) {
      sendMailInBackground({
        to: owner.email,
        ...reviewNoteMail({
          networkName: input.network.name,
          authorName: input.author.name,
          pinnedTo: input.pinnedTo,
          body: input.body,
          reply: input.reply,
          url: publicUrl(`/networks/${input.network.id}`),
        }),
      });
    }
  });
}

export async function startThread(
  db: Db,
  input: { reader: NoteReader; writer: NoteWriter; network: NetworkRow; document: Network; elementId: string | null; body: unknown },
): Promise<NoteOutcome> {
  const writing = authorOf(input.reader, input.writer);
  if (!writing.ok) return writing.outcome;
  const checked = checkNoteBody(input.body);
  if (!checked.ok) return { ok: false, status: 400, error: checked.error };
  const element = input.elementId ? findElement(input.document, input.elementId) : undefined;
  if (input.elementId && !element) {
    return { ok: false, status: 400, error: `There is no element "${input.elementId}" in revision ${input.network.current_revision} to pin the note to.` };
  }
  const threadId = await insertReviewThread(db, {
    networkId: input.network.id,
    elementId: element?.element.id ?? null,
    elementName: element?.element.name ?? null,
    revision: input.network.current_revision,
    author: writing.author.record,
    body: checked.body,
    now: new Date(),
  });
  await notifyOwners(db, {
    network: input.network,
    author: writing.author,
    pinnedTo: element ? describeElement(element).replace(/^\S+/, (word) => word.toLowerCase()) : "the sheet",
    body: checked.body,
    reply: false,
  });
  return { ok: true, message: element ? `Note pinned to ${element.element.name}.` : "Note pinned to the sheet.", threadId };
}

async function threadOf(db: Db, network: NetworkRow, threadId: number) {
  const thread = await findReviewThread(db, threadId);
  return thread && thread.network_id === network.id ? thread : undefined;
}

const NO_THREAD: NoteOutcome = { ok: false, status: 404, error: "There is no such review note on this network." };

export async function replyToThread(
  db: Db,
  input: { reader: NoteReader; writer: NoteWriter; network: NetworkRow; threadId: number; body: unknown },
): Promise<NoteOutcome> {
  const writing = authorOf(input.reader, input.writer);
  if (!writing.ok) return writing.outcome;
  const thread = await threadOf(db, input.network, input.threadId);
  if (!thread) return NO_THREAD;
  const checked = checkNoteBody(input.body);
  if (!checked.ok) return { ok: false, status: 400, error: checked.error };
  await insertReviewReply(db, { threadId: thread.id, author: writing.author.record, body: checked.body, now: new Date() });
  await notifyOwners(db, {
    network: input.network,
    author: writing.author,
    pinnedTo: thread.element_id ? `"${thread.element_name ?? "an element since removed"}"` : "the sheet",
    body: checked.body,
    reply: true,
  });
  return { ok: true, message: "Reply added.", threadId: thread.id };
}

export async function setResolved(
  db: Db,
  input: { reader: NoteReader; user: User; network: NetworkRow; threadId: number; resolved: boolean },
): Promise<NoteOutcome> {
  const writing = authorOf(input.reader, { user: input.user });
  if (!writing.ok) return writing.outcome;
  const thread = await threadOf(db, input.network, input.threadId);
  if (!thread) return NO_THREAD;
  if (!mayResolveThread(input.reader, { createdBy: thread.created_by })) {
    return { ok: false, status: 403, error: "Only the note's author or someone who may edit this network can resolve or reopen it." };
  }
  await setThreadResolved(db, thread.id, input.resolved ? input.user.id : null, new Date());
  return { ok: true, message: input.resolved ? "Marked resolved." : "Reopened.", threadId: thread.id };
}

export interface ReviewNotesView {
  threads: (ReviewThreadListing & { mayResolve: boolean })[];
  mayWrite: boolean;
  signedIn: boolean;
}

/** Threads with what this reader may do to each, for the panel. */
export async function reviewNotesFor(db: Db, networkId: number, reader: NoteReader): Promise<ReviewNotesView> {
  const threads = await listReviewThreads(db, networkId);
  return {
    threads: threads.map((t) => ({ ...t, mayResolve: mayResolveThread(reader, t) })),
    mayWrite: mayWriteNotes(reader),
    signedIn: reader.userId !== null,
  };
}
