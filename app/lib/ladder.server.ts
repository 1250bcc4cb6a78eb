// The voltage ladder on a stored network, shared by the ladder page, its study report and
// POST /api/networks/:id/ladder, so that all three compute the same thing from the same inputs.
import type { Db } from "#db/database.ts";
import { findLadderStudy, upsertLadderStudy } from "#db/ladderStudies.ts";
import type { NetworkRow } from "#db/schema.ts";
import { ladderRequestSchema, type Ladder, type LadderRequest } from "#solver/ladder.ts";
import type { ValidationIssue } from "#solver/schema.ts";
import { JOB_TIME_LIMIT_MS, startJob, type JobView } from "./compute/jobs.server.ts";
import { ladderOf, ladderWork } from "./compute/results.server.ts";
import { refusedRequestSentence } from "./api.server.ts";
import type { Actor } from "./permissions.server.ts";

export type LadderRun =
  | { ok: true; ladder: Ladder; revision: number }
  | { ok: false; status: 400 | 409 | 422; error: string; issues: ValidationIssue[] };

export type LadderJsonRun = { ok: true; json: string; revision: number } | Extract<LadderRun, { ok: false }>;

/** The ladder's refusal: the stored revision no longer validating (422), or the request (400). */
function refusal(network: NetworkRow, issues: ValidationIssue[]): Extract<LadderRun, { ok: false }> {
  if (issues.some((i) => i.path === "network" || i.path.startsWith("network."))) {
    return {
      ok: false,
      status: 422,
      error: `Revision ${network.current_revision} no longer passes the network file's checks; fix the network before running the ladder.`,
      issues: issues.map((i) => ({ path: i.path.replace(/^network\.?/, ""), message: i.message })),
    };
  }
  return { ok: false, status: 400, error: refusedRequestSentence("ladder", issues), issues };
}

/**
 * The ladder for the network's current revision, run (and the document checked) on the compute
 * pool, paid by `actor`'s budget; a refusal is a status, a sentence and named fields (a spent
 * budget or a stopped run is thrown, see computeRefusal).
 */
export async function runLadderOnNetwork(db: Db, network: NetworkRow, request: unknown, actor: Actor, signal?: AbortSignal): Promise<LadderRun> {
  const outcome = await ladderOf(db, network, request, actor, signal);
  return outcome.ok ? { ok: true, ladder: outcome.ladder, revision: network.current_revision } : refusal(network, outcome.issues);
}

/** The same for the API, whose answer the worker writes as JSON text. */
export async function ladderJsonOnNetwork(db: Db, network: NetworkRow, request: unknown, actor: Actor, signal?: AbortSignal): Promise<LadderJsonRun> {
  const outcome = await ladderOf(db, network, request, actor, signal, "json");
  return outcome.ok ? { ok: true, json: outcome.json, revision: network.current_revision } : refusal(network, outcome.issues);
}

export interface SavedLadderStudy {
  request: LadderRequest;
  networkRevision: number;
  updatedAt: string;
  updatedByName: string | null;
}

/**
 * The study saved with the network, or null. A stored study that no longer reads under the
 * request schema (the schema moved on) is reported as unreadable rather than guessed at.
 */
export async function savedLadderStudy(db: Db, networkId: number): Promise<{ study: SavedLadderStudy | null; unreadable: boolean }> {
  const stored = await findLadderStudy(db, networkId);
  if (!stored) return { study: null, unreadable: false };
  const request = {
    sectionBus: stored.sectionBus,
    voltagesKV: stored.voltagesKV,
    money: stored.money,
    ...(stored.overrides ? { overrides: stored.overrides } : {}),
    ...(stored.sizing ? { sizing: stored.sizing } : {}),
  };
  if (!ladderRequestSchema.safeParse(request).success) return { study: null, unreadable: true };
  return {
    study: { request: request as LadderRequest, networkRevision: stored.networkRevision, updatedAt: stored.updatedAt, updatedByName: stored.updatedByName },
    unreadable: false,
  };
}

/**
 * Keep a ladder request (defaults filled in) as the network's study. `basedOn` is the saved
 * study's updatedAt the page started from (null: none was saved): when someone else has saved
 * since, nothing is overwritten and the answer is a 409 refusal.
 */
async function storeLadderStudy(
  db: Db,
  network: NetworkRow,
  userId: number,
  request: unknown,
  basedOn: string | null,
): Promise<Extract<LadderRun, { ok: false }> | null> {
  const parsed = ladderRequestSchema.parse(request);
  const conflict = await db.transaction().execute(async (trx) => {
    const current = await findLadderStudy(trx, network.id);
    if ((current?.updatedAt ?? null) !== basedOn) return current ?? null;
    await upsertLadderStudy(trx, {
      networkId: network.id,
      sectionBus: parsed.sectionBus,
      voltagesKV: parsed.voltagesKV,
      overrides: parsed.overrides ?? null,
      money: parsed.money,
      sizing: parsed.sizing ?? null,
      networkRevision: network.current_revision,
      userId,
    });
    return undefined;
  });
  if (conflict === undefined) return null;
  const who = conflict ? `${conflict.updatedByName ?? "Someone"} saved the study at ${conflict.updatedAt}` : "The saved study was removed";
  return { ok: false, status: 409, error: `${who} after you opened this page; nothing was overwritten. Reload to see it, then save again.`, issues: [] };
}

/** Run the ladder and, when it runs, keep its inputs as the network's study (409 when `basedOn` is stale). */
export async function saveLadderStudy(
  db: Db,
  network: NetworkRow,
  actor: Actor & { kind: "user" },
  request: unknown,
  basedOn: string | null,
  signal?: AbortSignal,
): Promise<LadderRun> {
  const run = await runLadderOnNetwork(db, network, request, actor, signal);
  if (!run.ok) return run;
  return (await storeLadderStudy(db, network, actor.userId, request, basedOn)) ?? run;
}

/** What a finished ladder job holds: the ladder, and whether it was saved as the network's study. */
export interface LadderJobResult {
  ladder: Ladder;
  revision: number;
  saved: boolean;
}

/**
 * The ladder as a job (compute/jobs.server.ts): paid now from `actor`'s budget (a spent budget, or
 * too many jobs running, is thrown for computeRefusal), run on the pool with progress, and, when
 * `save` is given and the ladder runs, kept as the network's study as saveLadderStudy does.
 */
export async function startLadderJob(
  db: Db,
  network: NetworkRow,
  actor: Actor,
  request: unknown,
  save: { userId: number; basedOn: string | null } | null,
): Promise<JobView<LadderJobResult>> {
  const run = await ladderWork(db, network, request, actor);
  return startJob<LadderJobResult>(save ? "ladder-save" : "ladder", actor, network.id, async (signal, onProgress) => {
    const outcome = await run({ signal, onProgress, timeLimitMs: 2 * JOB_TIME_LIMIT_MS });
    if (!outcome.ok) return refusal(network, outcome.issues);
    if (save) {
      const refused = await storeLadderStudy(db, network, save.userId, request, save.basedOn);
      if (refused) return refused;
    }
    return { ok: true, result: { ladder: outcome.ladder, revision: network.current_revision, saved: save !== null } };
  });
}
