// Who may do what with review notes, given what the permissions module already answered about
// the network. Pure, so the server's checks and the panel's buttons are the same rules.
//  - reading needs view access (a view-link holder without an account reads too);
//  - writing a note or a reply needs an account, or a live view link and a name given with the
//    note (a reviewer outside the team); every note has a named author;
//  - resolving or reopening a thread needs an account and either edit access or the thread's
//    first note being one's own (a reviewer closes what they raised); a guest never resolves,
//    since nothing proves the next visitor with the link is the same person.
import { firstIssue, guestNameSchema, noteBodySchema } from "./fieldSchemas.ts";

export interface NoteReader {
  /** The signed-in user's id; null for someone holding a view link without an account. */
  userId: number | null;
  canView: boolean;
  canEdit: boolean;
  /** The view link a reader without an account came through; such a reader may write under a given name. */
  guestLinkId?: number;
}

export function mayReadNotes(reader: NoteReader): boolean {
  return reader.canView;
}

export function mayWriteNotes(reader: NoteReader): boolean {
  return reader.canView && (reader.userId !== null || reader.guestLinkId !== undefined);
}

export function mayResolveThread(reader: NoteReader, thread: { createdBy: number | null }): boolean {
  if (!mayWriteNotes(reader) || reader.userId === null) return false;
  return reader.canEdit || (thread.createdBy !== null && thread.createdBy === reader.userId);
}

/** The note's text trimmed, or the sentence that says why it cannot be stored. */
export function checkNoteBody(raw: unknown): { ok: true; body: string } | { ok: false; error: string } {
  const checked = noteBodySchema.safeParse(raw);
  return checked.success ? { ok: true, body: checked.data } : { ok: false, error: firstIssue(checked.error) };
}

/** The name a guest gives with a note, trimmed, or the sentence that says why it cannot be used. */
export function checkGuestName(raw: unknown): { ok: true; name: string } | { ok: false; error: string } {
  const checked = guestNameSchema.safeParse(raw);
  return checked.success ? { ok: true, name: checked.data } : { ok: false, error: firstIssue(checked.error) };
}

/** Open threads per element id ("" for the sheet as a whole), for badges and the panel's count. */
export function openCountsByElement(threads: readonly { elementId: string | null; resolvedAt: string | null }[]): Record<string, number> {
  const counts: Record<string, number> = {};
  for (const t of threads) {
    if (t.resolvedAt) continue;
    const key = t.elementId ?? "";
    counts[key] = (counts[key] ?? 0) + 1;
  }
  return counts;
}
