import type { Route } from "./+types/networks";
import { teamOfUser } from "#app/lib/access.server.ts";
import { apiError, parseId, readJsonBody } from "#app/lib/api.server.ts";
import { requireApiUser } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { networksOfUser, teamsToCreateIn } from "#app/lib/networkLists.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";

/** GET /api/networks: every live network of the caller's teams, then those shared with them by a live link. */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const db = await getDb();
  const { own, shared } = await networksOfUser(db, user.id);
  return Response.json({
    networks: [...own, ...shared].map((n) => ({
      id: n.id,
      name: n.name,
      team: { id: n.teamId, name: n.teamName },
      role: n.role,
      revision: n.revision,
      updatedAt: n.updatedAt,
      updatedBy: n.updatedByName,
    })),
  });
}

/** POST /api/networks?team=ID: create a network from the network file in the body. */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json(
      { error: `${request.method} is not supported here: GET lists networks, POST creates one.` },
      { status: 405, headers: { Allow: "GET, POST" } },
    );
  }
  const user = await requireApiUser(request);
  const teamParam = new URL(request.url).searchParams.get("team");
  let teamId: number;
  if (teamParam !== null) {
    const parsed = parseId(teamParam);
    if (parsed === null) return apiError(400, `"team" must be a team number, such as ?team=3; "${teamParam}" is not one.`);
    teamId = parsed;
  } else {
    const creatable = await teamsToCreateIn(await getDb(), user.id);
    if (creatable.length !== 1) {
      return apiError(
        400,
        creatable.length === 0
          ? "You are not an editor or owner of any team, so you cannot create networks."
          : `You may create networks in ${creatable.length} teams; name one with ?team=ID.`,
      );
    }
    teamId = creatable[0].id;
  }
  const { db, role } = await teamOfUser("api", user, teamId, "create-in-team");

  const document = await readJsonBody(request);
  const created = await createNetwork(db, { teamId, document, authorId: user.id, message: "Created through the API" });
  if (!created.ok) return apiError(400, "The network document is not valid; nothing was saved.", created.issues);
  const { network } = created;
  return Response.json(
    { id: network.id, name: network.name, teamId, revision: network.current_revision, role, document: created.document },
    { status: 201, headers: { Location: `/api/networks/${network.id}` } },
  );
}
