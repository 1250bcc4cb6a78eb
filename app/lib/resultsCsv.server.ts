// The saved revision's results as an RFC 4180 CSV download, for the network's API route and for a
// view link alike: one function, so both give the same file for the same revision.
import type { Db } from "#db/database.ts";
import type { NetworkRow } from "#db/schema.ts";
import { computeRefusal, revisionCsv } from "./compute/results.server.ts";
import { downloadFileStem } from "./downloadName.ts";
import { isCsvTable } from "#solver/csv.ts";
import type { Actor } from "./permissions.server.ts";

function plainText(sentence: string, status: number): Response {
  return new Response(`${sentence}\n`, { status, headers: { "Content-Type": "text/plain; charset=utf-8" } });
}

/** `table` is the request's `?table=` value, checked here so that every caller answers alike. */
export async function resultsCsvResponse(db: Db, network: NetworkRow, table: string | null, actor: Actor): Promise<Response> {
  if (!isCsvTable(table)) {
    return plainText("Name the table: ?table=buses, ?table=branches or ?table=sources.", 400);
  }
  const solved = await revisionCsv(db, network, table, actor).catch((failure) => computeRefusal(failure, "text"));
  if (!solved.ok) {
    return plainText(`Revision ${network.current_revision} no longer passes the network file's checks, so it has no results.`, 422);
  }
  const { csv } = solved;
  const filename = `${downloadFileStem(network.name)}-r${network.current_revision}-${table}.csv`;
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": `attachment; filename="${filename}"`,
      "Cache-Control": "no-store",
      "Kilostep-Revision": String(network.current_revision),
    },
  });
}
