// The study page's two ways of getting a study, for a network the caller may already read:
// a progress stream (one JSON line per progress report, then the study's rows) and a CSV
// download of one table. Both read the same query (studyOptions.ts) and run the study through
// study.server.ts, the one seam to the engine, so the page, the downloads and the API agree.
import type { Db } from "#db/database.ts";
import type { NetworkRow } from "#db/schema.ts";
import { downloadFileStem } from "./downloadName.ts";
import { runStudyOnNetwork } from "./study.server.ts";
import { parseStudyOptions } from "./studyOptions.ts";
import { studyView, type StudyView } from "./studyView.ts";
import { STUDY_CSV_TABLES, studyCsv, type StudyCsvTable } from "#solver/study/csv.ts";
import type { StudyProgress } from "#solver/study/index.ts";
import type { ValidationIssue } from "#solver/schema.ts";

/** One line of the progress stream. */
export type StudyStreamLine =
  | { progress: StudyProgress }
  | { view: StudyView; revision: number }
  | { error: string; issues: ValidationIssue[] };

function plainText(sentence: string, status: number): Response {
  return new Response(`${sentence}\n`, { status, headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" } });
}

function optionErrors(errors: Record<string, string | undefined>): string {
  return Object.values(errors).filter(Boolean).join(" ");
}

/**
 * The study as a stream of JSON lines: progress while it runs, then its rows (or why it could not
 * run). Closing the page aborts the request, which stops the study between two load flows.
 */
export function studyStreamResponse(db: Db, network: NetworkRow, search: URLSearchParams, requestSignal: AbortSignal): Response {
  const parsed = parseStudyOptions(search);
  if (!parsed.ok) return Response.json({ error: optionErrors(parsed.errors), fields: parsed.errors }, { status: 400 });
  const stopped = new AbortController();
  const signal = AbortSignal.any([requestSignal, stopped.signal]);
  const encoder = new TextEncoder();
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (line: StudyStreamLine) => {
        if (!signal.aborted) controller.enqueue(encoder.encode(`${JSON.stringify(line)}\n`));
      };
      try {
        const run = await runStudyOnNetwork(db, network, parsed.request, { signal, onProgress: (progress) => send({ progress }) });
        if (run.ok) send({ view: studyView(run.document, run.study), revision: run.revision });
        else send({ error: run.error, issues: run.issues.slice(0, 100) });
      } catch (failure) {
        if (!signal.aborted) send({ error: studyFailureSentence(failure), issues: [] });
      }
      if (!signal.aborted) controller.close();
    },
    cancel() {
      stopped.abort(new Error("The page stopped reading the study."));
    },
  });
  return new Response(stream, {
    headers: {
      "Content-Type": "application/x-ndjson; charset=utf-8",
      // no-transform: a compressing layer would hold the progress lines back until the end.
      "Cache-Control": "no-store, no-transform",
      "X-Accel-Buffering": "no",
      "Kilostep-Revision": String(network.current_revision),
    },
  });
}

/** A study that stopped for a reason of the server's (busy, too long), in a sentence. */
function studyFailureSentence(failure: unknown): string {
  const reason = failure instanceof Error && failure.message ? ` (${failure.message.replace(/\s+/g, " ").slice(0, 200)})` : "";
  return `The study stopped before it finished${reason}. Run it again; if it keeps stopping, run fewer parts at once (the cases alone, then outages).`;
}

function isTable(table: string | null): table is StudyCsvTable {
  return (STUDY_CSV_TABLES as readonly string[]).includes(table ?? "");
}

/** ?table=cases|envelope|outages|firm-capacity|years with the page's options: that table as CSV. */
export async function studyCsvResponse(db: Db, network: NetworkRow, search: URLSearchParams, signal: AbortSignal): Promise<Response> {
  const table = search.get("table");
  if (!isTable(table)) return plainText(`Name the table: ?table=${STUDY_CSV_TABLES.join(", ?table=")}.`, 400);
  const parsed = parseStudyOptions(search);
  if (!parsed.ok) return plainText(optionErrors(parsed.errors), 400);
  if ((table === "outages" || table === "firm-capacity") && !parsed.options.outages)
    return plainText(`The ${table === "outages" ? "N-1" : "firm capacity"} table needs the outage study: add outages=on.`, 400);
  if (table === "years" && !parsed.options.years) return plainText("The years table needs the years study: add years=on.", 400);
  const run = await runStudyOnNetwork(db, network, parsed.request, { signal });
  if (!run.ok) return plainText(run.error, run.status);
  const filename = `${downloadFileStem(network.name)}-r${run.revision}-study-${table}.csv`;
  return new Response(studyCsv(table, run.document, run.study), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": `attachment; filename="${filename}"`,
      "Cache-Control": "no-store",
      "Kilostep-Revision": String(run.revision),
    },
  });
}
