import { data } from "react-router";
import type { Route } from "./+types/job";
import { requireNetwork } from "#app/lib/access.server.ts";
import { cancelJob, jobView } from "#app/lib/compute/jobs.server.ts";

const NOT_FOUND =
  "There is no such calculation: it finished more than 15 minutes ago, the server restarted since it started, or it is not yours. Run it again.";

/**
 * GET /networks/:networkId/jobs/:jobId: a long calculation (a ladder, a study) this account
 * started on this network, as JSON: state, progress, the sentence when it failed, was cancelled or
 * stopped, and the result once done. Only whoever started it may see it.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { network, actor } = await requireNetwork(request, params, "view");
  const view = jobView(params.jobId, actor, network.id);
  if (!view) throw data(NOT_FOUND, { status: 404 });
  return Response.json(view, { headers: { "Cache-Control": "no-store" } });
}

/** POST a form with intent=cancel: stop the calculation; answers its view, now cancelled. */
export async function action({ request, params }: Route.ActionArgs) {
  const { network, actor } = await requireNetwork(request, params, "view");
  const intent = (await request.formData()).get("intent");
  if (intent !== "cancel") throw data('The only thing to do with a calculation is to cancel it: send intent "cancel".', { status: 400 });
  const view = await cancelJob(params.jobId, actor, network.id);
  if (!view) throw data(NOT_FOUND, { status: 404 });
  return Response.json(view, { headers: { "Cache-Control": "no-store" } });
}
