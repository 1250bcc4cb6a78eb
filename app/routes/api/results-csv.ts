// GET /api/networks/:id/results.csv?table=buses|branches — the saved revision's bus or branch
// results as RFC 4180 CSV with units in the header, as a download (viewer and above).
import type { Route } from "./+types/results-csv";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { resultsCsvResponse } from "#app/lib/resultsCsv.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network, actor } = await requireApiNetwork(request, params, "view");
  return resultsCsvResponse(db, network, new URL(request.url).searchParams.get("table"), actor);
}
