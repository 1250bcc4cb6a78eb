import type { Route } from "./+types/network-solve";
import { apiError } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { computeRefusal, solvedRevisionJson } from "#app/lib/compute/results.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";

/** POST /api/networks/:id/solve: load flow, fault levels and checks for the saved revision. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to solve the saved network." }, { status: 405, headers: { Allow: "POST" } });
  }
  const { db, network, actor } = await requireApiNetwork(request, params, "view");
  // A draft's problems were found when it was saved; solving it would only find them again.
  const { problems } = await currentDocument(db, network);
  if (problems.length) {
    return Response.json(
      { error: `Revision ${network.current_revision} is a draft, not a complete network yet; nothing was solved.`, problems },
      { status: 422 },
    );
  }
  const outcome = await solvedRevisionJson(db, network, actor).catch((failure) => computeRefusal(failure, "api"));
  if (!outcome.ok) {
    return apiError(422, `Revision ${network.current_revision} no longer passes the network file's checks.`, outcome.issues);
  }
  // The body is exactly the command line's output; which revision was solved travels in a header.
  return new Response(outcome.json, { headers: { "Content-Type": "application/json", "Kilostep-Revision": String(network.current_revision) } });
}
