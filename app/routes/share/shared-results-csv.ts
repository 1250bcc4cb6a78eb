// /s/:token/results.csv?table=buses|branches — the saved revision's results as RFC 4180 CSV for
// a view-link holder. The token is checked on this request like on every other: a link revoked
// while the shared page is open refuses its next download.
import type { Route } from "./+types/shared-results-csv";
import { getDb } from "#app/lib/db.server.ts";
import { networkReader } from "#app/lib/networkReader.server.ts";
import { resultsCsvResponse } from "#app/lib/resultsCsv.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  const { network, actor } = await networkReader(db, request, { token: params.token });
  return resultsCsvResponse(db, network, new URL(request.url).searchParams.get("table"), actor);
}
