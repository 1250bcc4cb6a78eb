import type { Route } from "./+types/network-solve";
import { apiError } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { solveNetwork } from "#solver/index.ts";

/** POST /api/networks/:id/solve: load flow, fault levels and checks for the saved revision. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to solve the saved network." }, { status: 405, headers: { Allow: "POST" } });
  }
  const { db, network } = await requireApiNetwork(request, params, "view");
  const { document } = await currentDocument(db, network);
  const outcome = solveNetwork(document);
  if (!outcome.ok) {
    return apiError(422, `Revision ${network.current_revision} no longer passes the network file's checks.`, outcome.issues);
  }
  // The body is exactly the command line's output; which revision was solved travels in a header.
  return Response.json(outcome.result, { headers: { "Kilostep-Revision": String(network.current_revision) } });
}
