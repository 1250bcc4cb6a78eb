// Who is reading a network page that a view link can also reach. The same loader serves
// /networks/:networkId/… (a signed-in person, with their team role or a grant) and
// /s/:token/… (whoever holds a view link, without an account). The token is checked on every
// request, so a link revoked a moment ago is refused at the next one.
import { data, redirect } from "react-router";
import type { Db } from "#db/database.ts";
import type { NetworkRow, TeamRole, User } from "#db/schema.ts";
import { parseId } from "./api.server.ts";
import { requireUser, userActor } from "./auth.server.ts";
import { grantedOrPageError, networkAccess, type Actor, type NetworkAction } from "./permissions.server.ts";
import { getSessionUser } from "./session.server.ts";
import { openShareLink, shareLinkActor, type OpenedShareLink } from "./shareLinks.server.ts";

export interface NetworkReader {
  network: NetworkRow;
  role: TeamRole;
  actor: Actor;
  /** The signed-in person; null for a view-link holder without an account. */
  user: User | null;
  /** Where this network's pages live for this reader: /networks/ID or /s/TOKEN. */
  home: string;
  viaLink: boolean;
}

/** Why a link opens nothing, in a sentence, with the status that goes with it. */
export function closedLinkAnswer(opened: Exclude<OpenedShareLink, { state: "live" }>): { status: 404 | 410; title: string; sentence: string } {
  switch (opened.state) {
    case "revoked":
      return { status: 410, title: "This link was revoked", sentence: "The network's owner revoked this share link, so it no longer opens anything. Ask them for a new one." };
    case "expired":
      return { status: 410, title: "This link has expired", sentence: "This share link has passed its expiry date, so it no longer opens anything. Ask the network's owner for a new one." };
    case "gone":
      return { status: 410, title: "This network is gone", sentence: "The network this link shared has been deleted." };
    case "unknown":
      return { status: 404, title: "Not a share link", sentence: "This address is not a Kilostep share link. Check that it was copied whole." };
  }
}

export async function networkReader(
  db: Db,
  request: Request,
  params: { networkId?: string; token?: string },
  action: NetworkAction = "view",
): Promise<NetworkReader> {
  if (params.token !== undefined) {
    const opened = await openShareLink(db, params.token);
    if (opened.state !== "live") {
      const closed = closedLinkAnswer(opened);
      throw data(closed.sentence, { status: closed.status });
    }
    // Edit links always need an account: their own page signs the holder in and records a grant.
    if (opened.link.role !== "viewer") throw redirect(`/s/${params.token}`);
    const actor = shareLinkActor(opened.link);
    const { network, role } = grantedOrPageError(await networkAccess(db, actor, opened.link.network_id, action));
    return { network, role, actor, user: await getSessionUser(request), home: `/s/${params.token}`, viaLink: true };
  }
  const user = await requireUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) throw data(`"${params.networkId}" is not a network number.`, { status: 404 });
  const actor = userActor(user);
  const { network, role } = grantedOrPageError(await networkAccess(db, actor, networkId, action));
  return { network, role, actor, user, home: `/networks/${network.id}`, viaLink: false };
}
