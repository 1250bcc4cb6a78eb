import type { Route } from "./+types/ladder";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { computeRefusal } from "#app/lib/compute/results.server.ts";
import { ladderJsonOnNetwork } from "#app/lib/ladder.server.ts";

/**
 * POST /api/networks/:id/ladder with { sectionBus, voltagesKV, money?, overrides? }: the voltage
 * ladder on the saved revision, one alternative per voltage in the order asked, each with its
 * full load flow, fault levels and checks beside the summary.
 */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to run the voltage ladder." }, { status: 405, headers: { Allow: "POST" } });
  }
  const { db, network, actor } = await requireApiNetwork(request, params, "view");
  const body = await readJsonBody(request);
  const run = await ladderJsonOnNetwork(db, network, body, actor, request.signal).catch((failure) => computeRefusal(failure, "api"));
  if (!run.ok) return apiError(run.status, run.error, run.issues);
  // The worker wrote the ladder's part; which network and revision lead the object.
  const json = `{"networkId":${network.id},"revision":${run.revision},${run.json.slice(1)}`;
  return new Response(json, { headers: { "Content-Type": "application/json", "Kilostep-Revision": String(run.revision) } });
}
