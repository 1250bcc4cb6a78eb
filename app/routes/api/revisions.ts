// GET /api/networks/:id/revisions — the revision list (viewer): number, time, author, message.
import type { Route } from "./+types/revisions";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { listRevisions } from "#db/revisions.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) return apiError(404, `"${params.networkId}" is not a network number.`);
  const db = await getDb();
  const { network } = grantedOrApiError(await networkAccess(db, userActor(user), networkId, "view"));
  const revisions = await listRevisions(db, network.id);
  return Response.json({
    networkId: network.id,
    current: network.current_revision,
    revisions: revisions.map((r) => ({ number: r.number, createdAt: r.createdAt, author: r.authorName, message: r.message })),
  });
}
