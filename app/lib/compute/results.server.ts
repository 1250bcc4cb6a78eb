// The server's computed answers, each run on the compute pool (pool.server.ts) and paid from the
// caller's budget (budget.server.ts). A stored revision (known by its number and its last save, as
// an autosave may fold into the revision) is solved once: the solve is kept (as bytes, see
// KeptSolve), and the API's JSON, every results CSV, the report and the shared report are made from
// it in a worker without solving again. Only work done is paid for: the solve by whoever asked
// first, a ladder by its voltages; a file made from a kept solve, and any answer already kept, is free.
import { data } from "react-router";
import type { NetworkRow } from "#db/schema.ts";
import type { LadderOutcome } from "#solver/ladder.ts";
import type { CsvTable } from "#solver/csv.ts";
import type { Db } from "../db.server.ts";
import { currentDocumentText } from "../networks.server.ts";
import { trustRevision } from "./trustedRevisions.server.ts";
import type { Actor } from "../permissions.server.ts";
import { solveCost, spend, type BudgetRefusal } from "./budget.server.ts";
import { compute, ComputeStopped, type ComputeOptions } from "./pool.server.ts";
import type { CsvOutcome, FromKept, JsonOutcome, KeptProduct, KeptSolve, ReportData } from "./tasks.ts";
import { teamConductorsForSizing } from "../library.server.ts";

/** The caller's budget was spent; `refusal` says how long to wait. */
export class BudgetExceeded extends Error {
  constructor(readonly refusal: BudgetRefusal) {
    super(refusal.error);
    this.name = "BudgetExceeded";
  }
}

/** Whose budget pays: the account, or the share link used without one. */
export function payerOf(actor: Actor): string {
  return actor.kind === "user" ? `user:${actor.userId}` : `link:${actor.linkId}`;
}

function busCountOf(document: unknown): number {
  const buses = (document as { buses?: unknown } | null)?.buses;
  return Array.isArray(buses) ? buses.length : 0;
}

/**
 * Kept answers, least recently used first, bounded in count and in size: a 10,000-bus solve keeps a
 * few megabytes, so the weight is the bytes of what is kept, counted once it is known.
 */
const CACHE_ENTRIES = 64;
const CACHE_BYTES = 256 * 1024 * 1024;
const cache = new Map<string, { answer: Promise<unknown>; bytes: number }>();
let cachedBytes = 0;

function forget(key: string) {
  const entry = cache.get(key);
  if (!entry) return;
  cache.delete(key);
  cachedBytes -= entry.bytes;
}

function bytesOf(value: unknown): number {
  if (value instanceof Uint8Array) return value.byteLength;
  if (value && typeof value === "object") {
    const v = value as { kept?: Uint8Array; json?: string; csv?: string };
    if (v.kept) return v.kept.byteLength;
    if (typeof v.json === "string") return v.json.length;
    if (typeof v.csv === "string") return v.csv.length;
  }
  // A report is cut to a few hundred rows in the worker; a guess at its size is enough here.
  return 1024 * 1024;
}

function keep<T>(key: string, answer: Promise<T>) {
  const entry = { answer: answer as Promise<unknown>, bytes: 0 };
  cache.set(key, entry);
  answer.then(
    (value) => {
      if (cache.get(key) !== entry) return;
      entry.bytes = bytesOf(value);
      cachedBytes += entry.bytes;
      trim();
    },
    () => {
      if (cache.get(key) === entry) forget(key);
    },
  );
  trim();
}

function trim() {
  while (cache.size > CACHE_ENTRIES || (cachedBytes > CACHE_BYTES && cache.size > 1)) forget(cache.keys().next().value!);
}

let solvesStarted = 0;

/** How many solves of stored revisions this process has started: the seam a test counts repeats through. */
export function storedSolveCount(): number {
  return solvesStarted;
}

function pay(payer: string, cost: number) {
  const refusal = spend(payer, cost);
  if (refusal) throw new BudgetExceeded(refusal);
}

/** Spend `cost` units of the actor's budget now, or throw BudgetExceeded (see computeRefusal). */
export function payFor(actor: Actor, cost: number): void {
  pay(payerOf(actor), cost);
}

/**
 * A ladder's units: one solve per candidate voltage (at most MAX_ALTERNATIVES are accepted), twice
 * that when it sizes the section's conductor (a solve per library type of the section's
 * construction, each a fraction of the alternative's own study).
 */
function ladderBusCost(buses: number, request: unknown): number {
  const voltages = (request as { voltagesKV?: unknown[] } | null)?.voltagesKV?.length ?? 1;
  const sizing = (request as { sizing?: unknown } | null)?.sizing ? 2 : 1;
  return solveCost(buses) * Math.max(1, Math.min(voltages, 12)) * sizing;
}

/**
 * A study's units: one solve per load flow it will run at most (the cases, each branch out in
 * each case asked for, each year in each case). Bigger than the budget means it runs only when
 * the budget is full (spend's rule), which is the point.
 */
export function studyCost(document: unknown, request: unknown): number {
  const d = (document ?? {}) as { cases?: unknown[]; lines?: unknown[]; transformers?: unknown[]; growth?: { years?: unknown } };
  const r = (request ?? {}) as { outages?: unknown; years?: unknown };
  const cases = Math.max(1, (Array.isArray(d.cases) ? d.cases.length : 0) + 1);
  const branches = (Array.isArray(d.lines) ? d.lines.length : 0) + (Array.isArray(d.transformers) ? d.transformers.length : 0);
  const outageCases = r.outages === true ? cases : Array.isArray(r.outages) ? r.outages.length : 0;
  const yearsOf = (y: unknown) => (typeof y === "number" && Number.isFinite(y) ? Math.max(0, Math.min(y, 100)) : 0);
  const years = r.years === true ? yearsOf(d.growth?.years) : typeof r.years === "object" && r.years ? yearsOf((r.years as { years?: unknown }).years) : 0;
  return solveCost(busCountOf(document)) * (cases + outageCases * branches + years * cases);
}

/** A kept answer, made most recently used; nothing is read or paid. */
function keptAnswer<T>(key: string): Promise<T> | undefined {
  const hit = cache.get(key);
  if (!hit) return undefined;
  cache.delete(key);
  cache.set(key, hit);
  return hit.answer as Promise<T>;
}

/**
 * One calculation per key: later askers (even while it runs) get the same promise, free, without
 * even reading the revision; the first reads it (as stored, see currentDocumentText), pays and runs.
 */
async function once<T>(key: string, payer: string, make: (stored: StoredRevision) => { cost: number; run: () => Promise<T> }, stored: () => Promise<StoredRevision>): Promise<T> {
  const hit = keptAnswer<T>(key);
  if (hit) return hit;
  const { cost, run } = make(await stored());
  const again = keptAnswer<T>(key);
  if (again) return again;
  pay(payer, cost);
  const made = run();
  keep(key, made);
  return made;
}

type StoredRevision = Awaited<ReturnType<typeof currentDocumentText>> & { network: NetworkRow };

function storedRevision(db: Db, network: NetworkRow): () => Promise<StoredRevision> {
  return async () => ({ ...(await currentDocumentText(db, network)), network });
}

/** The task's input for a stored revision; a revision that solves is trusted from then on. */
function storedInput(revision: StoredRevision) {
  return { stored: { text: revision.text, trusted: revision.trusted } };
}

function trustWhenSolved<T extends { ok: boolean } | { solved: { ok: boolean } }>(revision: StoredRevision, answer: Promise<T>): Promise<T> {
  return answer.then((value) => {
    const ok = "solved" in value ? value.solved.ok : value.ok;
    if (ok) trustRevision(revision.network.id, revision.network.current_revision, revision.savedAt);
    return value;
  });
}

/** An editing session's autosaves fold into its revision, so the revision number alone does not name a document; the time of the last save does. */
function revisionKey(kind: string, network: NetworkRow, extra = ""): string {
  return `${kind}:${network.id}:${network.current_revision}:${network.updated_at}:${extra}`;
}

/** The revision's one solve, kept: run and paid for by the first asker, shared by every later one. */
function keptSolve(db: Db, network: NetworkRow, actor: Actor): Promise<KeptSolve> {
  return once(
    revisionKey("solved", network),
    payerOf(actor),
    (revision) => ({
      cost: solveCost(revision.buses),
      run: () => {
        solvesStarted++;
        return trustWhenSolved(revision, compute({ kind: "solve-kept", ...storedInput(revision) }));
      },
    }),
    storedRevision(db, network),
  );
}

/**
 * Something made from the revision's kept solve, itself kept: `extraCost` pays for work beyond
 * reading the solve (the report's ladder), charged only when it is made.
 */
async function fromKeptSolve<T extends FromKept>(
  db: Db,
  network: NetworkRow,
  actor: Actor,
  key: string,
  want: KeptProduct,
  extraCost: (buses: number) => number = () => 0,
): Promise<T | Extract<KeptSolve, { ok: false }>> {
  const hit = keptAnswer<T>(key);
  if (hit) return hit;
  const solved = await keptSolve(db, network, actor);
  if (!solved.ok) return solved;
  const again = keptAnswer<T>(key);
  if (again) return again;
  pay(payerOf(actor), extraCost(solved.buses));
  const made = compute({ kind: "from-kept", kept: solved.kept, ...want }) as Promise<T>;
  keep(key, made);
  return made;
}

/**
 * Any other answer about the current revision, kept like the solve: `make` runs (and pays) only for
 * the first asker; later ones share its promise. A failure (a spent budget, a stop) is not kept.
 */
export function keptForRevision<T>(network: NetworkRow, kind: string, extra: string, make: () => Promise<T>): Promise<T> {
  const key = revisionKey(kind, network, extra);
  const hit = keptAnswer<T>(key);
  if (hit) return hit;
  const made = make();
  keep(key, made);
  return made;
}

/** Load flow, fault levels and checks of the network's current revision, as the API's JSON. */
export async function solvedRevisionJson(db: Db, network: NetworkRow, actor: Actor): Promise<JsonOutcome> {
  return fromKeptSolve<JsonOutcome>(db, network, actor, revisionKey("json", network), { product: "json" });
}

/** The current revision's bus or branch results as CSV, or { ok: false } when it does not solve. */
export async function revisionCsv(db: Db, network: NetworkRow, table: CsvTable, actor: Actor): Promise<CsvOutcome> {
  const made = await fromKeptSolve<CsvOutcome>(db, network, actor, revisionKey("csv", network, table), { product: "csv", table });
  return made.ok ? made : { ok: false };
}

/** Whether a ladder request asks to size the section's conductor (then the team's library counts). */
const asksSizing = (request: unknown) => Boolean((request as { sizing?: unknown } | null)?.sizing);

/** The team's conductor types for a ladder that sizes, with their fingerprint for kept answers; none otherwise. */
async function sizingLibrary(db: Db, network: NetworkRow, request: unknown) {
  return asksSizing(request) ? teamConductorsForSizing(db, network.team_id) : { conductors: [], fingerprint: "" };
}

/** The study report's numbers for the current revision and the saved study (kept per both and the team's conductors when it sizes), cut to what the report lists. */
export async function revisionReport(db: Db, network: NetworkRow, study: { request: unknown; updatedAt: string } | null, actor: Actor): Promise<ReportData> {
  const library = await sizingLibrary(db, network, study?.request ?? null);
  return fromKeptSolve<ReportData>(
    db,
    network,
    actor,
    revisionKey("report", network, `${study?.updatedAt ?? ""}|${library.fingerprint}`),
    { product: "report", study: study?.request ?? null, conductors: library.conductors },
    (buses) => (study ? ladderBusCost(buses, study.request) : 0),
  );
}

/** The voltage ladder on a network's current revision, as stored (not kept: each request asks something new). */
export function ladderOf(db: Db, network: NetworkRow, request: unknown, actor: Actor, signal?: AbortSignal): Promise<LadderOutcome>;
export function ladderOf(db: Db, network: NetworkRow, request: unknown, actor: Actor, signal: AbortSignal | undefined, form: "json"): Promise<JsonOutcome>;
export async function ladderOf(db: Db, network: NetworkRow, request: unknown, actor: Actor, signal?: AbortSignal, form?: "json") {
  const revision = await storedRevision(db, network)();
  pay(payerOf(actor), ladderBusCost(revision.buses, request));
  const { conductors } = await sizingLibrary(db, network, request);
  const input = storedInput(revision);
  return form === "json"
    ? compute({ kind: "ladder-json", request, conductors, ...input }, { signal })
    : compute({ kind: "ladder", request, conductors, ...input }, { signal });
}

/** The ladder as a job's work: the stored revision read now and paid for now; run when the job calls it. */
export async function ladderWork(db: Db, network: NetworkRow, request: unknown, actor: Actor): Promise<(options: ComputeOptions) => Promise<LadderOutcome>> {
  const revision = await storedRevision(db, network)();
  pay(payerOf(actor), ladderBusCost(revision.buses, request));
  const { conductors } = await sizingLibrary(db, network, request);
  return (options) => compute({ kind: "ladder", request, conductors, ...storedInput(revision) }, options);
}

/** Solve a document sent with the request (not stored, so not kept), as the API's JSON. */
export async function solveSentJson(document: unknown, actor: Actor): Promise<JsonOutcome> {
  pay(payerOf(actor), solveCost(busCountOf(document)));
  return compute({ kind: "solve-json", document });
}

/** A refused or stopped calculation as a status and its sentence, for a page's own answer; anything else is rethrown. */
export function computeRefusalOf(failure: unknown): { status: number; error: string } {
  if (failure instanceof BudgetExceeded) return { status: 429, error: failure.message };
  if (failure instanceof ComputeStopped) return { status: 503, error: failure.message };
  if (failure instanceof Error && failure.name === "TooManyJobs") return { status: 429, error: failure.message };
  throw failure;
}

/** The saved ladder study's ladder on the current revision, kept per revision and study (the ladder page shows it on every visit). */
export async function savedLadderOf(db: Db, network: NetworkRow, study: { request: unknown; updatedAt: string }, actor: Actor): Promise<LadderOutcome> {
  const library = await sizingLibrary(db, network, study.request);
  return once(
    revisionKey("saved-ladder", network, `${study.updatedAt}|${library.fingerprint}`),
    payerOf(actor),
    (revision) => ({
      cost: ladderBusCost(revision.buses, study.request),
      run: () => compute({ kind: "ladder", request: study.request, conductors: library.conductors, ...storedInput(revision) }),
    }),
    storedRevision(db, network),
  );
}

/**
 * A refused or stopped calculation as the caller's answer: 429 with Retry-After for a spent
 * budget, 503 with the sentence for work stopped at its time limit. Anything else is rethrown.
 */
export function computeRefusal(failure: unknown, caller: "page" | "api" | "text"): never {
  let status: number;
  let headers: Record<string, string> = {};
  if (failure instanceof BudgetExceeded) {
    status = 429;
    headers = { "Retry-After": String(failure.refusal.retryAfterSeconds) };
  } else if (failure instanceof ComputeStopped) status = 503;
  else if (failure instanceof Error && failure.name === "TooManyJobs") status = 429;
  else throw failure;
  const sentence = failure.message;
  if (caller === "page") throw data(sentence, { status, headers });
  if (caller === "api") throw Response.json({ error: sentence }, { status, headers });
  throw new Response(`${sentence}\n`, { status, headers: { ...headers, "Content-Type": "text/plain; charset=utf-8" } });
}
