import type { Route } from "./+types/network-study";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { computeRefusal } from "#app/lib/compute/results.server.ts";
import { runStudyOnNetwork } from "#app/lib/study.server.ts";

/**
 * POST /api/networks/:id/study with { outages?, years? } (an empty body runs the cases alone):
 * every operating case of the saved revision, the envelope, outages, years and energy, in the
 * shape the command line prints and the study page shows. Runs on the compute pool, paid from the
 * caller's budget (429 when spent), stopped at the time limit (503) with a sentence.
 */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to run a study of the saved network." }, { status: 405, headers: { Allow: "POST" } });
  }
  const { db, network, actor } = await requireApiNetwork(request, params, "view");
  const empty = (await request.clone().text()).trim() === "";
  const body = empty ? {} : await readJsonBody(request);
  const run = await runStudyOnNetwork(db, network, body, { signal: request.signal, actor }).catch((failure) => computeRefusal(failure, "api"));
  if (!run.ok) return apiError(run.status, run.error, run.issues);
  return Response.json(run.study, { headers: { "Kilostep-Revision": String(run.revision) } });
}
