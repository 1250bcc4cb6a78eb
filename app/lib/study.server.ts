// The study on a stored network, one seam for the study page, the report and
// POST /api/networks/:id/study, so that all of them compute the same thing from the same inputs.
// The engine runs a slice at a time (runStudy), so a long study leaves the server room for other
// requests, reports progress and stops when the request is abandoned.
import type { Db } from "#db/database.ts";
import type { NetworkRow } from "#db/schema.ts";
import { runStudy, type Study, type StudyControl } from "#solver/study/index.ts";
import { validateNetwork, type Network, type ValidationIssue } from "#solver/schema.ts";
import { currentDocument } from "./networks.server.ts";
import { refusedRequestSentence } from "./api.server.ts";

export type StudyRun =
  | { ok: true; study: Study; revision: number; document: Network }
  | { ok: false; status: 400 | 422; error: string; issues: ValidationIssue[] };

/** The study of the network's current revision; every refusal is a status, a sentence and named fields. */
export async function runStudyOnNetwork(db: Db, network: NetworkRow, request: unknown, control: StudyControl = {}): Promise<StudyRun> {
  const { document } = await currentDocument(db, network);
  const checked = validateNetwork(document);
  if (!checked.ok)
    return {
      ok: false,
      status: 422,
      error: `Revision ${network.current_revision} no longer passes the network file's checks; fix the network before running a study.`,
      issues: checked.issues,
    };
  const outcome = await runStudy(checked.network, request, control);
  if (!outcome.ok) {
    return {
      ok: false,
      status: 400,
      error: refusedRequestSentence("study", outcome.issues),
      issues: outcome.issues,
    };
  }
  return { ok: true, study: outcome.study, revision: network.current_revision, document: checked.network };
}
