import type { Route } from "./+types/network-solve";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { solveNetwork } from "#solver/index.ts";

/** POST /api/networks/:id/solve: load flow, fault levels and checks for the saved revision. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to solve the saved network." }, { status: 405, headers: { Allow: "POST" } });
  }
  const user = await requireApiUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) return apiError(404, `"${params.networkId}" is not a network number.`);
  const db = await getDb();
  const { network } = grantedOrApiError(await networkAccess(db, userActor(user), networkId, "view"));
  const { document } = await currentDocument(db, network);
  const outcome = solveNetwork(document);
  if (!outcome.ok) {
    return apiError(422, `Revision ${network.current_revision} no longer passes the network file's checks.`, outcome.issues);
  }
  // The body is exactly the command line's output; which revision was solved travels in a header.
  return Response.json(outcome.result, { headers: { "Kilostep-Revision": String(network.current_revision) } });
}
