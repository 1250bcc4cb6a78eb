// GET /networks/:networkId/study.csv?table=cases|envelope|outages|firm-capacity|years (and
// /s/:token/study.csv for a view link), with the study page's query: one table of the study of
// the saved revision as RFC 4180 CSV. The token is checked on this request like on every other.
import type { Route } from "./+types/study-csv";
import { getDb } from "#app/lib/db.server.ts";
import { networkReader } from "#app/lib/networkReader.server.ts";
import { studyCsvResponse } from "#app/lib/studyRun.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  const { network, actor } = await networkReader(db, request, params);
  return studyCsvResponse(db, network, actor, new URL(request.url).searchParams, request.signal);
}
