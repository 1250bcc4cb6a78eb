// GET /api/networks/:id/revisions/:n — one revision's document (viewer), with its author, time
// and message.
import type { Route } from "./+types/revision";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { readRevision } from "#db/networks.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) return apiError(404, `"${params.networkId}" is not a network number.`);
  const db = await getDb();
  const { network } = grantedOrApiError(await networkAccess(db, userActor(user), networkId, "view"));
  const number = parseId(params.number);
  if (number === null) return apiError(404, `"${params.number}" is not a revision number.`);
  const revision = await readRevision(db, network.id, number);
  if (!revision) return apiError(404, `Network ${network.id} has no revision ${number}; its newest is ${network.current_revision}.`);
  return Response.json({
    networkId: network.id,
    number,
    current: network.current_revision,
    createdAt: revision.createdAt,
    author: revision.authorName,
    message: revision.message,
    document: revision.document,
  });
}
