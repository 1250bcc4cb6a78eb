import type { Route } from "./+types/network-export";
import { apiError, parseId } from "#app/lib/api.server.ts";
import { requireApiNetwork } from "#app/lib/access.server.ts";
import { currentDocument, storedRevision } from "#app/lib/networks.server.ts";
import { downloadFileStem } from "#app/lib/downloadName.ts";

/** The network file's download name, e.g. `tarn-head-to-calder-flats-fictional-r3.json`. */
export function exportFileName(name: string, revision: number): string {
  return `${downloadFileStem(name)}-r${revision}.json`;
}

/**
 * GET /api/networks/:id/export (or ?revision=N): the network file as a download, the same JSON
 * document that the upload page and POST /api/networks accept back.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network } = await requireApiNetwork(request, params, "view");
  const asked = new URL(request.url).searchParams.get("revision");
  let revision = network.current_revision;
  let document: unknown;
  if (asked === null) document = (await currentDocument(db, network)).document;
  else {
    const number = parseId(asked);
    const found = number === null ? undefined : await storedRevision(db, network, number);
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
