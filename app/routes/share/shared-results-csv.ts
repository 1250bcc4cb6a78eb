// /s/:token/results.csv?table=buses|branches — the saved revision's results as RFC 4180 CSV for
// a view-link holder. The token is checked on this request like on every other: a link revoked
// while the shared page is open refuses its next download.
import type { Route } from "./+types/shared-results-csv";
import { getDb } from "#app/lib/db.server.ts";
import { networkReader } from "#app/lib/networkReader.server.ts";
import { currentDocument } from "#app/lib/networks.server.ts";
import { branchesCsv, busesCsv } from "#solver/csv.ts";
import { solveNetwork } from "#solver/index.ts";

function fileStem(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60) || "network";
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const table = new URL(request.url).searchParams.get("table");
  const db = await getDb();
  const { network } = await networkReader(db, request, { token: params.token });
  if (table !== "buses" && table !== "branches") {
    return new Response('Name the table: ?table=buses or ?table=branches.\n', { status: 400, headers: { "Content-Type": "text/plain; charset=utf-8" } });
  }
  const { document } = await currentDocument(db, network);
  const solved = solveNetwork(document);
  if (!solved.ok) {
    return new Response(`Revision ${network.current_revision} no longer passes the network file's checks, so it has no results.\n`, {
      status: 422,
      headers: { "Content-Type": "text/plain; charset=utf-8" },
    });
  }
  const csv = table === "buses" ? busesCsv(solved.network, solved.result) : branchesCsv(solved.network, solved.result);
  const filename = `${fileStem(network.name)}-r${network.current_revision}-${table}.csv`;
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": `attachment; filename="${filename}"`,
      "Cache-Control": "no-store",
    },
  });
}
