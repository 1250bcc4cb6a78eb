import { z } from "zod";
import type { Route } from "./+types/network";
import { apiError, issuesUnder, parseId, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { auditNetworkDeletion } from "#app/lib/audit.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { currentDocument, saveNetworkDocument } from "#app/lib/networks.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { formatPath } from "#solver/schema.ts";
import { markNetworkDeleted, RESTORE_WINDOW_DAYS } from "#db/networks.ts";

const putBodySchema = z.strictObject({
  revision: z.number().int().positive(),
  document: z.unknown(),
  message: z.string().max(500).optional(),
});

function networkIdOf(params: { networkId: string }): number {
  const id = parseId(params.networkId);
  if (id === null) throw apiError(404, `"${params.networkId}" is not a network number.`);
  return id;
}

/** GET /api/networks/:id → { id, name, revision, role, document } */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const db = await getDb();
  const { network, role } = grantedOrApiError(await networkAccess(db, userActor(user), networkIdOf(params), "view"));
  const { document } = await currentDocument(db, network);
  return Response.json({ id: network.id, name: network.name, revision: network.current_revision, role, document });
}

/** PUT saves `{ revision, document }` as the next revision (409 when stale); DELETE deletes (owner). */
export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireApiUser(request);
  const actor = userActor(user);
  const db = await getDb();
  const networkId = networkIdOf(params);

  if (request.method === "PUT") {
    const { role } = grantedOrApiError(await networkAccess(db, actor, networkId, "edit"));
    const parsed = putBodySchema.safeParse(await readJsonBody(request));
    if (!parsed.success) {
      return apiError(
        400,
        "The body must be { revision, document } with revision the number you last read.",
        parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })),
      );
    }
    const { revision, document, message } = parsed.data;
    const saved = await saveNetworkDocument(db, { networkId, expectedRevision: revision, document, authorId: user.id, message });
    if (!saved.ok && saved.reason === "invalid") {
      return apiError(400, "The network document is not valid; nothing was saved.", issuesUnder("document", saved.issues));
    }
    if (!saved.ok) {
      if (saved.currentRevision === null) return apiError(404, `There is no network ${networkId} that you can open.`);
      return Response.json(
        {
          error: `Revision ${revision} is not the current one: the network is at revision ${saved.currentRevision}. Nothing was saved; fetch it again and reapply your change.`,
          currentRevision: saved.currentRevision,
        },
        { status: 409 },
      );
    }
    const { network } = grantedOrApiError(await networkAccess(db, actor, networkId, "view"));
    const current = await currentDocument(db, network);
    return Response.json({ id: network.id, name: network.name, revision: saved.revision, role, document: current.document });
  }

  if (request.method === "DELETE") {
    const { network } = grantedOrApiError(await networkAccess(db, actor, networkId, "delete"));
    const deletedAt = new Date();
    await markNetworkDeleted(db, network.id, user.id, deletedAt);
    await auditNetworkDeletion(db, { network, by: user, restored: false });
    const restorableUntil = new Date(deletedAt.getTime() + RESTORE_WINDOW_DAYS * 86_400_000).toISOString();
    return Response.json({ id: network.id, deleted: true, restorableUntil });
  }

  return Response.json(
    { error: `${request.method} is not supported here: use GET, PUT or DELETE.` },
    { status: 405, headers: { Allow: "GET, PUT, DELETE" } },
  );
}
