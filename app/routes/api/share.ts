// DELETE /api/shares/:id — revoke a share link at once (the network's owner). Every page and
// request the link reached is refused from the next request on; grants made from it end too.
import type { Route } from "./+types/share";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { revokeShareLink, shareLinkById } from "#app/lib/shareLinks.server.ts";

export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "DELETE") {
    return Response.json({ error: `${request.method} is not supported here: DELETE revokes the link.` }, { status: 405, headers: { Allow: "DELETE" } });
  }
  const user = await requireApiUser(request);
  const missing = apiError(404, `There is no share link ${params.shareId} that you can revoke.`);
  const shareId = parseId(params.shareId);
  if (shareId === null) return missing;
  const db = await getDb();
  const link = await shareLinkById(db, shareId);
  if (!link) return missing;
  // Someone who cannot see the network learns nothing about its links, not even that one exists.
  const access = await networkAccess(db, userActor(user), link.network_id, "share");
  if (!access.ok && access.status === 404) return missing;
  grantedOrApiError(access);
  const revoked = await revokeShareLink(db, link, user);
  return Response.json({ id: link.id, revoked: true, alreadyRevoked: !revoked });
}
