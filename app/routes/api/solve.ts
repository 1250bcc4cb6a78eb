import type { Route } from "./+types/solve";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { computeRefusal, solveSentJson } from "#app/lib/compute/results.server.ts";

/** POST /api/solve: solve the network file in the body; nothing is saved. Same result shape as the command line. */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST with a network file as the body." }, { status: 405, headers: { Allow: "POST" } });
  }
  const actor = userActor(await requireApiUser(request));
  const outcome = await solveSentJson(await readJsonBody(request), actor).catch((failure) => computeRefusal(failure, "api"));
  if (!outcome.ok) return apiError(400, "The network document is not valid; it was not solved.", outcome.issues);
  return new Response(outcome.json, { headers: { "Content-Type": "application/json" } });
}
