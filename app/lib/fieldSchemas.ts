// zod schemas for the free-text fields that several forms and the API share: names of networks
// and teams, review notes and messages. Each states its limit and its sentences once, so the page
// (maxLength), the action and the API refuse alike; e-mail addresses and passwords likewise for
// every account form (sign-in, sign-up, invitations, review requests, resets).
import { z } from "zod";

export const NETWORK_NAME_MAX = 200;
export const TEAM_NAME_MAX = 100;
export const NOTE_BODY_MAX = 4000;
export const GUEST_NAME_MAX = 80;
export const REVISION_MESSAGE_MAX = 500;
export const REVIEW_MESSAGE_MAX = 2000;
export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 200;

/** An e-mail address, trimmed; `missing` is the sentence for an empty field (whose address?). */
export function emailSchema(missing = "Enter your e-mail address.") {
  return z.string({ error: missing }).trim().min(1, missing).pipe(z.email("Enter an e-mail address such as ada@example.org."));
}

/** A new password: long enough to resist guessing, short enough that hashing it stays cheap. */
export const chosenPasswordSchema = z
  .string({ error: `Choose a password of at least ${MIN_PASSWORD_LENGTH} characters.` })
  .min(MIN_PASSWORD_LENGTH, `Choose a password of at least ${MIN_PASSWORD_LENGTH} characters.`)
  .max(MAX_PASSWORD_LENGTH, `A password may have at most ${MAX_PASSWORD_LENGTH} characters.`);

const networkNameTooLong = `A name may have at most ${NETWORK_NAME_MAX} characters.`;

/** A network's name, trimmed; required. */
export const networkNameSchema = z
  .string({ error: "Give the network a name." })
  .trim()
  .min(1, "Give the network a name.")
  .max(NETWORK_NAME_MAX, networkNameTooLong);

/** A name chosen when creating from a starting point: empty means "use the starting point's". */
export const optionalNetworkNameSchema = z.string().trim().max(NETWORK_NAME_MAX, networkNameTooLong);

/** A team's name, trimmed; required. */
export const teamNameSchema = z
  .string({ error: "Give the team a name." })
  .trim()
  .min(1, "Give the team a name.")
  .max(TEAM_NAME_MAX, `A team name may have at most ${TEAM_NAME_MAX} characters.`);

/** A review note or reply, trimmed; required. */
export const noteBodySchema = z
  .string({ error: "Write something in the note first." })
  .trim()
  .min(1, "Write something in the note first.")
  .max(NOTE_BODY_MAX, { error: (issue) => `A note may have at most ${NOTE_BODY_MAX} characters; this one has ${String(issue.input).length}.` });

/** The name someone without an account signs a review note with; required. */
export const guestNameSchema = z
  .string({ error: "Give your name with the note, so the team knows who wrote it." })
  .trim()
  .min(1, "Give your name with the note, so the team knows who wrote it.")
  .max(GUEST_NAME_MAX, `A name may have at most ${GUEST_NAME_MAX} characters.`);

/** The message that goes with a saved revision. */
export const revisionMessageSchema = z.string().max(REVISION_MESSAGE_MAX);

/** The personal message in a review request. */
export const reviewMessageSchema = z.string().max(REVIEW_MESSAGE_MAX, "The message may have at most 2,000 characters.");

/** The first sentence of a failed parse, for forms that show one message. */
export function firstIssue(error: z.ZodError): string {
  return error.issues[0]?.message ?? "Check the form.";
}
