import type { Route } from "./+types/network-study-jobs";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { computeRefusal } from "#app/lib/compute/results.server.ts";
import { startStudyJob, studyJobAnswer, studyRequestRefusal } from "#app/lib/study.server.ts";

/**
 * POST /api/networks/:id/study/jobs with { outages?, years? } (as POST …/study): starts the study
 * of the saved revision as a job and answers 202 at once, with the job's address in `url` and
 * `Location`. GET that address for its progress and, once done, the study; DELETE it to cancel.
 * Paid from the caller's budget when it starts (429 when spent, or with two jobs running already).
 */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST to start a study; GET and DELETE its job's url." }, { status: 405, headers: { Allow: "POST" } });
  }
  const { db, network, actor } = await requireApiNetwork(request, params, "view");
  const empty = (await request.clone().text()).trim() === "";
  const body = empty ? {} : await readJsonBody(request);
  const refused = studyRequestRefusal(body);
  if (refused) return apiError(refused.status, refused.error, refused.issues);
  const job = await startStudyJob(db, network, body, actor).catch((failure) => computeRefusal(failure, "api"));
  const answer = studyJobAnswer(job);
  return Response.json(answer, { status: 202, headers: { Location: answer.url, "Cache-Control": "no-store" } });
}
