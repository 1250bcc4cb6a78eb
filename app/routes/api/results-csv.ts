// GET /api/networks/:id/results.csv?table=buses|branches — the saved revision's bus or branch
// results as RFC 4180 CSV with units in the header, as a download (viewer and above).
import type { Route } from "./+types/results-csv";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { resultsCsvResponse } from "#app/lib/resultsCsv.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) return apiError(404, `"${params.networkId}" is not a network number.`);
  const db = await getDb();
  const { network } = grantedOrApiError(await networkAccess(db, userActor(user), networkId, "view"));
  return resultsCsvResponse(db, network, new URL(request.url).searchParams.get("table"));
}
