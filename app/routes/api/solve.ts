import type { Route } from "./+types/solve";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiUser } from "#app/lib/auth.server.ts";
import { solveNetwork } from "#solver/index.ts";

/** POST /api/solve: solve the network file in the body; nothing is saved. Same result shape as the command line. */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: "Use POST with a network file as the body." }, { status: 405, headers: { Allow: "POST" } });
  }
  await requireApiUser(request);
  const outcome = solveNetwork(await readJsonBody(request));
  if (!outcome.ok) return apiError(400, "The network document is not valid; it was not solved.", outcome.issues);
  return Response.json(outcome.result);
}
