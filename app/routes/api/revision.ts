// GET /api/networks/:id/revisions/:n — one revision's document (viewer), with its author, time
// and message.
import type { Route } from "./+types/revision";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { storedRevision } from "#app/lib/networks.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network } = await requireApiNetwork(request, params, "view");
  const number = parseId(params.number);
  if (number === null) return apiError(404, `"${params.number}" is not a revision number.`);
  const revision = await storedRevision(db, network, number);
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
