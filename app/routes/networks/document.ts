import type { Route } from "./+types/document";
import { requireNetwork } from "#app/lib/access.server.ts";
import { checkedDraftText, currentRevisionAsStored, documentVersion } from "#app/lib/networks.server.ts";

/**
 * GET /networks/:networkId/document?v=…: the current revision's document for the sheet, as the
 * JSON text it is stored as (compressed by the server, never parsed or encoded again). The sheet
 * page sends a large network's document this way rather than inside the page: a page that carries
 * megabytes of escaped JSON costs seconds to write and read. The address names the version
 * (`documentVersion`), so the browser may keep it; an address of an older version gets the
 * current document, not kept.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { db, network } = await requireNetwork(request, params, "view");
  const revision = await currentRevisionAsStored(db, network);
  const checked = checkedDraftText(network, revision);
  if (!checked.ok) return Response.json({ error: "This revision no longer passes the network file's checks.", issues: checked.issues.slice(0, 100) }, { status: 422 });
  const asked = new URL(request.url).searchParams.get("v");
  const current = asked === documentVersion(network.current_revision, revision.createdAt);
  return new Response(checked.text, {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Cache-Control": current ? "private, max-age=31536000, immutable" : "private, no-store",
    },
  });
}
