// /api/networks/:id/shares — share links of one network (owner). POST { role, expiresInDays,
// label? } → 201 { id, url, role, expiresAt }: the url carries the token and is shown only here.
// GET lists the links with their state and uses (never a token).
import type { Route } from "./+types/network-shares";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { apiError, readJsonBody } from "#app/lib/api.server.ts";
import { createShareLink, shareLinksOf } from "#app/lib/shareLinks.server.ts";
import { shareRequestSchema } from "#app/lib/shareRequest.ts";
import { formatPath } from "#solver/schema.ts";

export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network } = await requireApiNetwork(request, params, "share");
  const links = await shareLinksOf(db, network.id);
  return Response.json({
    networkId: network.id,
    shares: links.map((l) => ({
      id: l.id,
      role: l.role,
      label: l.label,
      createdAt: l.createdAt,
      createdBy: l.createdByName,
      expiresAt: l.expiresAt,
      revokedAt: l.revokedAt,
      state: l.state,
      uses: l.uses.map((u) => ({ user: u.userEmail, usedAt: u.usedAt })),
    })),
  });
}

export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") {
    return Response.json({ error: `${request.method} is not supported here: GET lists links, POST makes one.` }, { status: 405, headers: { Allow: "GET, POST" } });
  }
  const { db, user, network } = await requireApiNetwork(request, params, "share");
  const parsed = shareRequestSchema.safeParse(await readJsonBody(request));
  if (!parsed.success) {
    return apiError(
      400,
      'The body must be { "role": "viewer" or "editor", "expiresInDays": days or null }.',
      parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })),
    );
  }
  const { link, url } = await createShareLink(db, { network, request: parsed.data, by: user });
  return Response.json(
    { id: link.id, url, role: link.role, expiresAt: link.expires_at },
    { status: 201, headers: { Location: `/api/shares/${link.id}`, "Cache-Control": "no-store" } },
  );
}
