import type { Route } from "./+types/ladder";
import { apiError, parseId, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { runLadderOnNetwork } from "#app/lib/ladder.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";

/**
 * POST /api/networks/:id/ladder with { sectionBus, voltagesKV, money?, overrides? }: the voltage
 * ladder on the saved revision, one alternative per voltage in the order asked, each with its
 * full load flow, fault levels and checks beside the summary.
 */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to run the voltage ladder." }, { status: 405, headers: { Allow: "POST" } });
  }
  const user = await requireApiUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) return apiError(404, `"${params.networkId}" is not a network number.`);
  const db = await getDb();
  const { network } = grantedOrApiError(await networkAccess(db, userActor(user), networkId, "view"));
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
