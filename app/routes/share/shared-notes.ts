// /s/:token/notes — review notes written by someone holding a view link without an account. They
// sign each note or reply with a name; they cannot resolve threads. The link is checked on every
// post, so a revoked link stops notes at once, and posts are limited per link and per address
// because nothing else stands between the open internet and the team owners' mailboxes.
import { data } from "react-router";
import type { Route } from "./+types/shared-notes";
import { parseId } from "#app/lib/api.server.ts";
import { clientAddressOf } from "#app/lib/clientAddress.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { closedLinkAnswer } from "#app/lib/networkReader.server.ts";
import { createRateLimiter } from "#app/lib/rateLimit.server.ts";
import { guardPageRequest } from "#app/lib/requestGuards.server.ts";
import { replyToThread, startThread, type NoteOutcome } from "#app/lib/reviewNotes.server.ts";
import { openShareLink } from "#app/lib/shareLinks.server.ts";
import { validateNetwork } from "#solver/schema.ts";

/** Notes an hour through one link, and from one address across links. */
export const GUEST_NOTES_PER_LINK_PER_HOUR = 30;
export const GUEST_NOTES_PER_ADDRESS_PER_HOUR = 10;
const HOUR_MS = 60 * 60 * 1000;
const perLink = createRateLimiter({ limit: GUEST_NOTES_PER_LINK_PER_HOUR, windowMs: HOUR_MS });
const perAddress = createRateLimiter({ limit: GUEST_NOTES_PER_ADDRESS_PER_HOUR, windowMs: HOUR_MS });

function answer(outcome: NoteOutcome) {
  return data(outcome.ok ? { ok: true, message: outcome.message } : { ok: false, message: outcome.error }, { status: outcome.ok ? 200 : outcome.status });
}

function refuse(message: string, status: number, headers?: HeadersInit) {
  return data({ ok: false, message }, { status, headers });
}

export async function action({ request, params, context }: Route.ActionArgs) {
  guardPageRequest(request);
  const db = await getDb();
  const opened = await openShareLink(db, params.token);
  if (opened.state !== "live") {
    const closed = closedLinkAnswer(opened);
    return refuse(closed.sentence, closed.status);
  }
  const { link, network } = opened;
  // An edit link's holder signs in (its page records a grant) and writes on the network's own page.
  if (link.role !== "viewer") return refuse("Sign in to write notes through an edit link.", 403);

  const form = await request.formData();
  const intent = form.get("intent");
  if (intent === "resolve" || intent === "reopen")
    return refuse("Resolving or reopening a note needs an account: sign in or ask the team to do it.", 403);
  if (intent !== "start" && intent !== "reply") return refuse("Unknown request: the form named no known action.", 400);

  for (const [limiter, key, what] of [
    [perLink, `link:${link.id}`, "through this link"],
    [perAddress, `address:${clientAddressOf(context) ?? "unknown"}`, "from your address"],
  ] as const) {
    const verdict = limiter.hit(key);
    if (!verdict.allowed)
      return refuse(`Too many notes ${what} in the last hour. Wait ${Math.ceil(verdict.retryAfterSeconds / 60)} min, or sign in to write more.`, 429, {
        "Retry-After": String(verdict.retryAfterSeconds),
      });
  }

  const reader = { userId: null, canView: true, canEdit: false, guestLinkId: link.id };
  const writer = { guest: { name: form.get("guestName"), linkId: link.id } };
  if (intent === "reply") {
    const threadId = parseId(String(form.get("threadId") ?? ""));
    if (threadId === null) return refuse("Which note? The request names none.", 400);
    return answer(await replyToThread(db, { reader, writer, network, threadId, body: form.get("body") }));
  }
  const checked = validateNetwork((await currentDocument(db, network)).document);
  if (!checked.ok) return refuse("The current revision does not validate, so notes cannot be pinned to it.", 409);
  const elementId = String(form.get("elementId") ?? "").trim();
  return answer(await startThread(db, { reader, writer, network, document: checked.network, elementId: elementId || null, body: form.get("body") }));
}
