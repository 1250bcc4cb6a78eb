// GET /api/networks/:id/revisions — the revision list (viewer): number, time, author, message.
import type { Route } from "./+types/revisions";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { revisionHistory } from "#app/lib/revisions.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network } = await requireApiNetwork(request, params, "view");
  const revisions = await revisionHistory(db, network.id);
  return Response.json({
    networkId: network.id,
    current: network.current_revision,
    revisions: revisions.map((r) => ({ number: r.number, createdAt: r.createdAt, author: r.authorName, message: r.message })),
  });
}
