// /networks/:id/notes — review notes of one network. GET lists the threads (view access); POST
// writes: intent "start" (a new thread pinned to elementId, or to the sheet), "reply",
// "resolve" and "reopen". Writing needs an account; the rules are in reviewNotePermissions.ts.
import { data } from "react-router";
import type { Route } from "./+types/notes";
import { requireNetwork } from "#app/lib/access.server.ts";
import { parseId } from "#app/lib/api.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { roleAllows } from "#app/lib/permissions.server.ts";
import { replyToThread, reviewNotesFor, setResolved, startThread, type NoteOutcome } from "#app/lib/reviewNotes.server.ts";
import { validateNetwork } from "#solver/schema.ts";

async function readerOf(request: Request, params: { networkId: string }) {
  const { db, user, network, role } = await requireNetwork(request, params, "view");
  return { db, user, network, reader: { userId: user.id, canView: true, canEdit: roleAllows(role, "edit") } };
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, reader } = await readerOf(request, params);
  return Response.json(await reviewNotesFor(db, network.id, reader));
}

function answer(outcome: NoteOutcome) {
  return data(outcome.ok ? { ok: true, message: outcome.message } : { ok: false, message: outcome.error }, { status: outcome.ok ? 200 : outcome.status });
}

export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") return data({ ok: false, message: "Use POST to write review notes." }, { status: 405 });
  const { db, user, network, reader } = await readerOf(request, params);
  const form = await request.formData();
  const intent = form.get("intent");

  if (intent === "start") {
    const { document } = await currentDocument(db, network);
    const checked = validateNetwork(document);
    if (!checked.ok) return data({ ok: false, message: "The current revision does not validate, so notes cannot be pinned to it." }, { status: 409 });
    const elementId = String(form.get("elementId") ?? "").trim();
    return answer(
      await startThread(db, { reader, writer: { user }, network, document: checked.network, elementId: elementId || null, body: form.get("body") }),
    );
  }
  const threadId = parseId(String(form.get("threadId") ?? ""));
  if (threadId === null) return data({ ok: false, message: "Which note? The request names none." }, { status: 400 });
  if (intent === "reply") return answer(await replyToThread(db, { reader, writer: { user }, network, threadId, body: form.get("body") }));
  if (intent === "resolve" || intent === "reopen") {
    return answer(await setResolved(db, { reader, user, network, threadId, resolved: intent === "resolve" }));
  }
  return data({ ok: false, message: "Unknown request: the form named no known action." }, { status: 400 });
}
