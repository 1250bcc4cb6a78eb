// The study page's two ways of getting a study, for a network the caller may already read:
// a progress stream (one JSON line per progress report, then the study's rows) and a CSV
// download of one table. Both read the same query (studyOptions.ts) and run the study through
// study.server.ts, the one seam to the engine, so the page, the downloads and the API agree.
import type { Db } from "#db/database.ts";
import type { NetworkRow } from "#db/schema.ts";
import { downloadFileStem } from "./downloadName.ts";
import { JOB_TIME_LIMIT_MS } from "./compute/jobs.server.ts";
import { computeRefusal, computeRefusalOf, payFor, studyCost } from "./compute/results.server.ts";
import { currentDocument } from "./networks.server.ts";
import type { Actor } from "./permissions.server.ts";
import { runStudyOnNetwork, type JobProgress, type StudyRun } from "./study.server.ts";
import { parseStudyOptions } from "./studyOptions.ts";
import { studyView, type StudyView } from "./studyView.ts";
import { STUDY_CSV_TABLES, studyCsv, type StudyCsvTable } from "#solver/study/csv.ts";
import type { ValidationIssue } from "#solver/schema.ts";

/** One line of the progress stream. */
export type StudyStreamLine =
  | { progress: JobProgress }
  | { view: StudyView; revision: number }
  | { error: string; issues: ValidationIssue[] };

/**
 * The last few studies run, by network, revision and request: the page's CSV downloads read the
 * study the page has just run instead of paying for it again. A new revision is a new key.
 */
const RECENT_MAX = 8;
const RECENT_MS = 10 * 60_000;
const recent = new Map<string, { at: number; run: Extract<StudyRun, { ok: true }> }>();

function recentKey(network: NetworkRow, request: unknown): string {
  return `${network.id}:${network.current_revision}:${JSON.stringify(request)}`;
}

function remember(key: string, run: StudyRun): void {
  if (!run.ok) return;
  recent.delete(key);
  recent.set(key, { at: Date.now(), run });
  while (recent.size > RECENT_MAX) recent.delete(recent.keys().next().value!);
}

function recalled(key: string): Extract<StudyRun, { ok: true }> | null {
  const hit = recent.get(key);
  if (!hit || Date.now() - hit.at > RECENT_MS) return null;
  return hit.run;
}

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
export async function studyStreamResponse(db: Db, network: NetworkRow, actor: Actor, search: URLSearchParams, requestSignal: AbortSignal): Promise<Response> {
  const parsed = parseStudyOptions(search);
  if (!parsed.ok) return Response.json({ error: optionErrors(parsed.errors), fields: parsed.errors }, { status: 400 });
  // Paid before the stream opens, so a spent budget is a plain 429 with its sentence.
  try {
    payFor(actor, studyCost((await currentDocument(db, network)).document, parsed.request));
  } catch (failure) {
    const refused = computeRefusalOf(failure);
    return Response.json({ error: refused.error }, { status: refused.status });
  }
  const stopped = new AbortController();
  const signal = AbortSignal.any([requestSignal, stopped.signal]);
  const encoder = new TextEncoder();
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (line: StudyStreamLine) => {
        if (!signal.aborted) controller.enqueue(encoder.encode(`${JSON.stringify(line)}\n`));
      };
      try {
        const run = await runStudyOnNetwork(db, network, parsed.request, { signal, onProgress: (progress) => send({ progress }), timeLimitMs: JOB_TIME_LIMIT_MS });
        remember(recentKey(network, parsed.request), run);
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

/** A study that stopped for a reason of the server's (its time limit, a busy pool), in a sentence. */
function studyFailureSentence(failure: unknown): string {
  try {
    return computeRefusalOf(failure).error;
  } catch {
    return "The study stopped before it finished because of a fault on the server. Run it again; if it keeps stopping, run fewer parts at once (the cases alone, then outages).";
  }
}

function isTable(table: string | null): table is StudyCsvTable {
  return (STUDY_CSV_TABLES as readonly string[]).includes(table ?? "");
}

/** ?table=cases|envelope|outages|firm-capacity|years with the page's options: that table as CSV. */
export async function studyCsvResponse(db: Db, network: NetworkRow, actor: Actor, search: URLSearchParams, signal: AbortSignal): Promise<Response> {
  const table = search.get("table");
  if (!isTable(table)) return plainText(`Name the table: ?table=${STUDY_CSV_TABLES.join(", ?table=")}.`, 400);
  const parsed = parseStudyOptions(search);
  if (!parsed.ok) return plainText(optionErrors(parsed.errors), 400);
  if ((table === "outages" || table === "firm-capacity") && !parsed.options.outages)
    return plainText(`The ${table === "outages" ? "N-1" : "firm capacity"} table needs the outage study: add outages=on.`, 400);
  if (table === "years" && !parsed.options.years) return plainText("The years table needs the years study: add years=on.", 400);
  const key = recentKey(network, parsed.request);
  const run = recalled(key) ?? (await runStudyOnNetwork(db, network, parsed.request, { signal, actor }).catch((failure: unknown) => computeRefusal(failure, "text")));
  if (!run.ok) return plainText(run.error, run.status);
  remember(key, run);
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
