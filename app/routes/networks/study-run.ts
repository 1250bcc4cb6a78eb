// GET /networks/:networkId/study/run (and /s/:token/study/run for a view link), with the study
// page's query: the study as a stream of JSON lines, progress first, then the page's rows.
// Whoever may read the network may run its study; it changes nothing stored.
import type { Route } from "./+types/study-run";
import { getDb } from "#app/lib/db.server.ts";
import { networkReader } from "#app/lib/networkReader.server.ts";
import { studyStreamResponse } from "#app/lib/studyRun.server.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const db = await getDb();
  const { network, actor } = await networkReader(db, request, params);
  return studyStreamResponse(db, network, actor, new URL(request.url).searchParams, request.signal);
}
