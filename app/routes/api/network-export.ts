import type { Route } from "./+types/network-export";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiUser, userActor } from "#app/lib/auth.server.ts";
import { getDb } from "#app/lib/db.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { grantedOrApiError, networkAccess } from "#app/lib/permissions.server.ts";
import { downloadFileStem } from "#app/lib/downloadName.ts";
import { readRevision } from "#db/networks.ts";

/** The network file's download name, e.g. `tarn-head-to-calder-flats-fictional-r3.json`. */
export function exportFileName(name: string, revision: number): string {
  return `${downloadFileStem(name)}-r${revision}.json`;
}

/**
 * GET /api/networks/:id/export (or ?revision=N): the network file as a download, the same JSON
 * document that the upload page and POST /api/networks accept back.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  const networkId = parseId(params.networkId);
  if (networkId === null) return apiError(404, `"${params.networkId}" is not a network number.`);
  const db = await getDb();
  const { network } = grantedOrApiError(await networkAccess(db, userActor(user), networkId, "view"));
  const asked = new URL(request.url).searchParams.get("revision");
  let revision = network.current_revision;
  let document: unknown;
  if (asked === null) document = (await currentDocument(db, network)).document;
  else {
    const number = parseId(asked);
    const found = number === null ? undefined : await readRevision(db, network.id, number);
    if (!found) return apiError(404, `Network ${network.id} has no revision "${asked}"; it is at revision ${network.current_revision}.`);
    revision = number!;
    document = found.document;
  }
  const fileName = exportFileName(network.name, revision);
  return new Response(`${JSON.stringify(document, null, 2)}\n`, {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Disposition": `attachment; filename="${fileName}"`,
      "Kilostep-Revision": String(revision),
      "Cache-Control": "private, no-store",
    },
  });
}
