import type { Route } from "./+types/ladder";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { runLadderOnNetwork } from "#app/lib/ladder.server.ts";

/**
 * POST /api/networks/:id/ladder with { sectionBus, voltagesKV, money?, overrides? }: the voltage
 * ladder on the saved revision, one alternative per voltage in the order asked, each with its
 * full load flow, fault levels and checks beside the summary.
 */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to run the voltage ladder." }, { status: 405, headers: { Allow: "POST" } });
  }
  const { db, network } = await requireApiNetwork(request, params, "view");
  const body = await readJsonBody(request);
  const run = await runLadderOnNetwork(db, network, body);
  if (!run.ok) return apiError(run.status, run.error, run.issues);
  const { ladder } = run;
  return Response.json(
    {
      networkId: network.id,
      revision: run.revision,
      sectionBus: ladder.sectionBus,
      section: ladder.section,
      money: ladder.money,
      alternatives: ladder.alternatives,
      cheapest: ladder.cheapest,
      sensitivity: ladder.sensitivity,
      inverseSquareReference: ladder.inverseSquareReference,
    },
    { headers: { "Kilostep-Revision": String(run.revision) } },
  );
}
