import type { Route } from "./+types/network-study-job";
import { apiError } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { cancelJob, jobView, type JobView } from "#app/lib/compute/jobs.server.ts";
import { studyJobAnswer, type StudyJobResult } from "#app/lib/study.server.ts";

const NOT_FOUND =
  "There is no such study job: it finished more than 15 minutes ago, the server restarted since it started, or it is not yours. Start it again.";

function answer(view: JobView | null): Response {
  if (!view || view.kind !== "study") return apiError(404, NOT_FOUND);
  const headers: Record<string, string> = { "Cache-Control": "no-store" };
  const shown = studyJobAnswer(view as JobView<StudyJobResult>);
  if (shown.revision !== undefined) headers["Kilostep-Revision"] = String(shown.revision);
  return Response.json(shown, { headers });
}

/**
 * GET /api/networks/:id/study/jobs/:jobId: the study job this caller started, as
 * { id, state, progress, error, status, issues, startedAt, finishedAt, url } and, once its state
 * is "done", { revision, study } with the study in the shape POST …/study answers. Only whoever
 * started it (the account, whichever token or session it used) may see it.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { network, actor } = await requireApiNetwork(request, params, "view");
  const view = jobView(params.jobId, actor, network.id);
  return answer(view?.kind === "study" ? view : null);
}

/** DELETE: cancel the study while it runs (its worker thread is ended); answers the job, now cancelled, or as it finished. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "DELETE") {
    return Response.json({ error: "GET a study job to follow it, DELETE it to cancel it." }, { status: 405, headers: { Allow: "GET, DELETE" } });
  }
  const { network, actor } = await requireApiNetwork(request, params, "view");
  const seen = jobView(params.jobId, actor, network.id);
  if (seen?.kind !== "study") return answer(null);
  return answer(await cancelJob(params.jobId, actor, network.id));
}
