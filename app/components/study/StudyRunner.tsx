// Runs the study on the server and shows it: reads the progress stream (one JSON line per report,
// then the rows), shows how many load flows are solved, and the tables when they arrive. Leaving
// the page or asking for another study aborts the request, which stops the study on the server.
import { useEffect, useState } from "react";
import { Notice } from "#app/components/Notice.tsx";
import { StudyTables } from "#app/components/study/StudyTables.tsx";
import type { StudyView } from "#app/lib/studyView.ts";
import type { StudyCsvTable } from "#solver/study/csv.ts";

/** What the server reports while the study runs: load flows done of the most it needs, and a sentence. */
interface StudyProgress {
  done: number;
  total: number;
  stage: string;
}

type RunState =
  | { phase: "starting" }
  | { phase: "running"; progress: StudyProgress }
  | { phase: "done"; view: StudyView; revision: number }
  | { phase: "failed"; error: string; issues: { path: string; message: string }[] };

async function readStream(response: Response, onLine: (line: Record<string, unknown>) => void) {
  const reader = response.body!.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (done) break;
    buffer += value;
    let end: number;
    while ((end = buffer.indexOf("\n")) >= 0) {
      const text = buffer.slice(0, end).trim();
      buffer = buffer.slice(end + 1);
      if (text) onLine(JSON.parse(text) as Record<string, unknown>);
    }
  }
}

export function StudyRunner({ url, csvBase, query, expectedLoadFlows }: { url: string; csvBase: string; query: string; expectedLoadFlows: number }) {
  const [state, setState] = useState<RunState>({ phase: "starting" });

  useEffect(() => {
    const abort = new AbortController();
    let finished = false;
    (async () => {
      const response = await fetch(url, { signal: abort.signal, headers: { Accept: "application/x-ndjson" } });
      if (!response.ok) {
        const type = response.headers.get("Content-Type") ?? "";
        const body = type.includes("json") ? ((await response.json()) as { error?: string }) : { error: (await response.text()).trim() };
        setState({ phase: "failed", error: body.error || `The server answered ${response.status}.`, issues: [] });
        return;
      }
      await readStream(response, (line) => {
        if ("progress" in line) setState({ phase: "running", progress: line.progress as StudyProgress });
        else if ("view" in line) {
          finished = true;
          setState({ phase: "done", view: line.view as StudyView, revision: line.revision as number });
        } else if ("error" in line) {
          finished = true;
          setState({ phase: "failed", error: String(line.error), issues: (line.issues as { path: string; message: string }[]) ?? [] });
        }
      });
      if (!finished) setState({ phase: "failed", error: "The connection closed before the study finished. Run it again.", issues: [] });
    })().catch((failure: unknown) => {
      if (abort.signal.aborted) return;
      setState({ phase: "failed", error: `The study could not be fetched (${failure instanceof Error ? failure.message : String(failure)}). Check the connection and run it again.`, issues: [] });
    });
    return () => abort.abort();
  }, [url]);

  const csvHref = (table: StudyCsvTable) => `${csvBase}?table=${table}${query ? `&${query.slice(1)}` : ""}`;

  if (state.phase === "done") return <StudyTables view={state.view} csvHref={csvHref} />;
  if (state.phase === "failed")
    return (
      <Notice tone="error">
        {state.error}
        {state.issues.length > 0 ? (
          <ul className="mt-2 list-disc pl-5">
            {state.issues.map((issue) => (
              <li key={`${issue.path}-${issue.message}`}>
                {issue.path ? <code>{issue.path}</code> : null} {issue.message}
              </li>
            ))}
          </ul>
        ) : null}
      </Notice>
    );
  const progress = state.phase === "running" ? state.progress : null;
  const total = progress?.total ?? expectedLoadFlows;
  return (
    <div className="panel p-5 ks-study-progress" aria-busy="true">
      <label htmlFor="study-progress" className="field-label">
        Running the study on the server
      </label>
      <progress id="study-progress" max={total} value={progress?.done ?? 0} />
      <p role="status" className="field-hint">
        {progress
          ? `${progress.stage}.`
          : `Starting: about ${total.toLocaleString("en-GB")} load flows to solve.`}
      </p>
    </div>
  );
}
