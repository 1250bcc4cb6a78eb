// Load test, open loop: the built server on loopback, asked at a fixed arrival rate (100 requests
// a second by default, the four routes mixed in turn) whether or not earlier answers have come
// back, so a slow server shows as latency and not as a politely lower request rate (a closed loop
// of connections measures only throughput). Latency is counted from when each request was due.
// Then each route alone, a few seconds at full speed, to measure what it costs: requests per
// second per core, from the server process's own CPU time (all its threads, the compute pool's
// included). Prints p50, p95, p99 and errors per route beside the targets, and the load average.
// Run: `npm run loadtest` (it builds first; LOADTEST_SECONDS, LOADTEST_RATE change the run).
import { readFileSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import { DEMO_ACCOUNTS } from "#db/demoAccounts.ts";
import { copyBuild, freePort, seededDatabase, signInCookie, startServer } from "../tools/builtServer.ts";

const SECONDS = Number(process.env.LOADTEST_SECONDS ?? 20);
const RATE = Number(process.env.LOADTEST_RATE ?? 100);
/** Seconds of each route alone at full speed, for its cost per core. */
const COST_SECONDS = Number(process.env.LOADTEST_COST_SECONDS ?? 4);
const COST_CONCURRENCY = 8;
const TIMEOUT_MS = 10_000;
const TARGET_P95_MS = { api: 50, page: 150 } as const;

interface Target {
  name: string;
  kind: keyof typeof TARGET_P95_MS;
  path: string;
  method?: string;
  body?: string;
  contentType?: string;
}

interface Sample {
  ms: number;
  status: number;
}

/** The q-quantile of sorted values by the nearest-rank method. */
function quantile(sorted: number[], q: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))];
}

const loadText = () => loadavg().map((l) => l.toFixed(2)).join(" / ");

/** The server process's CPU seconds so far (user + system, every thread), from /proc. */
function cpuSeconds(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1].split(" ");
  // utime and stime are fields 14 and 15 of the file, 12 and 13 after the command name; clock ticks of 1/100 s.
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

async function ask(url: string, cookie: string, target: Target): Promise<number> {
  const response = await fetch(`${url}${target.path}`, {
    method: target.method ?? "GET",
    headers: { Cookie: cookie, Origin: url, "Accept-Encoding": "gzip", ...(target.contentType ? { "Content-Type": target.contentType } : {}) },
    body: target.body,
    signal: AbortSignal.timeout(TIMEOUT_MS),
  });
  await response.arrayBuffer();
  return response.status;
}

/** The open-loop run: request i of the mix is sent at i / RATE seconds, whatever came back. */
async function openLoop(url: string, cookie: string, targets: Target[]): Promise<Map<Target, Sample[]>> {
  const samples = new Map<Target, Sample[]>(targets.map((t) => [t, []]));
  const total = Math.round(SECONDS * RATE);
  const start = performance.now();
  const pending: Promise<void>[] = [];
  for (let i = 0; i < total; i++) {
    const due = start + (i * 1000) / RATE;
    const wait = due - performance.now();
    if (wait > 1) await new Promise((done) => setTimeout(done, wait));
    const target = targets[i % targets.length];
    pending.push(
      ask(url, cookie, target).then(
        (status) => void samples.get(target)!.push({ ms: performance.now() - due, status }),
        () => void samples.get(target)!.push({ ms: performance.now() - due, status: 0 }),
      ),
    );
  }
  await Promise.all(pending);
  return samples;
}

/** One route alone, COST_CONCURRENCY at a time: answers per second per core of server CPU. */
async function costOf(url: string, cookie: string, target: Target, pid: number): Promise<{ perCoreSecond: number; perSecond: number }> {
  const cpuBefore = cpuSeconds(pid);
  const start = performance.now();
  const end = start + COST_SECONDS * 1000;
  let answered = 0;
  await Promise.all(
    Array.from({ length: COST_CONCURRENCY }, async () => {
      while (performance.now() < end) {
        await ask(url, cookie, target).catch(() => 0);
        answered++;
      }
    }),
  );
  const wall = (performance.now() - start) / 1000;
  const cpu = cpuSeconds(pid) - cpuBefore;
  return { perCoreSecond: answered / Math.max(cpu, 0.01), perSecond: answered / wall };
}

function table(header: string[], lines: string[][]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i].length)));
  const format = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(widths[i])).join(" | ")} |`;
  return [format(header), format(widths.map((w) => "-".repeat(w))), ...lines.map(format)].join("\n");
}

async function main() {
  const build = copyBuild();
  const database = await seededDatabase();
  // The compute budget would turn most of this run into 429s; it is tested on its own, here the
  // server's speed is measured.
  const server = await startServer({
    build,
    databasePath: database.databasePath,
    port: await freePort(),
    env: { SOLVE_RATE_LIMIT_PER_MINUTE: "100000000" },
  });
  try {
    const editor = DEMO_ACCOUNTS.find((a) => a.role === "editor")!;
    const cookie = await signInCookie(server.url, editor.email, editor.password);
    const listed = (await (await fetch(`${server.url}/api/networks`, { headers: { Cookie: cookie } })).json()) as {
      networks: { id: number; name: string }[];
    };
    const network = listed.networks.find((n) => n.name.startsWith("Tarn Head")) ?? listed.networks[0];
    const fixture = readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8");
    const targets: Target[] = [
      { name: "networks page GET /networks", kind: "page", path: "/networks" },
      { name: `sheet data GET /networks/${network.id}.data`, kind: "page", path: `/networks/${network.id}.data` },
      { name: "solve API POST /api/solve", kind: "api", path: "/api/solve", method: "POST", body: fixture, contentType: "application/json" },
      { name: "CSV GET …/results.csv?table=buses", kind: "api", path: `/api/networks/${network.id}/results.csv?table=buses` },
    ];
    for (const target of targets) {
      const status = await ask(server.url, cookie, target);
      if (status !== 200) console.log(`note: ${target.name} answers ${status} before the run`);
    }
    const loadBefore = loadText();
    console.log(
      `load test, open loop: ${RATE} requests/s for ${SECONDS} s, the ${targets.length} routes in turn, against ${server.url} ` +
        `(built app, NODE_ENV=production); ${availableParallelism()} cores, load average before ${loadBefore}`,
    );
    const samples = await openLoop(server.url, cookie, targets);
    const loadAfterOpen = loadText();
    const costs = new Map<Target, { perCoreSecond: number; perSecond: number }>();
    for (const target of targets) costs.set(target, await costOf(server.url, cookie, target, server.child.pid!));

    const rows = targets.map((target) => {
      const list = samples.get(target)!;
      const ms = list.map((s) => s.ms).sort((a, b) => a - b);
      const errors = list.filter((s) => s.status !== 200).length;
      const limit = TARGET_P95_MS[target.kind];
      const p95 = quantile(ms, 0.95);
      const cost = costs.get(target)!;
      return {
        target,
        met: p95 <= limit && errors === 0,
        cells: [
          target.name,
          String(list.length),
          quantile(ms, 0.5).toFixed(1),
          p95.toFixed(1),
          quantile(ms, 0.99).toFixed(1),
          String(errors),
          `${limit} ms`,
          p95 <= limit && errors === 0 ? "yes" : "NO",
          cost.perCoreSecond.toFixed(0),
          cost.perSecond.toFixed(0),
        ],
      };
    });
    console.log(
      table(
        ["route", "requests", "p50 ms", "p95 ms", "p99 ms", "errors", "p95 target", "met", "req/s per core", `req/s alone (${COST_CONCURRENCY} at once)`],
        rows.map((r) => r.cells),
      ),
    );
    console.log(`load average: before ${loadBefore}; after the open-loop run ${loadAfterOpen}; at the end ${loadText()} (${availableParallelism()} cores)`);
    const failing = rows.filter((r) => !r.met).map((r) => r.target.name);
    console.log(
      failing.length === 0
        ? `every route met its p95 target (API ≤ ${TARGET_P95_MS.api} ms, pages ≤ ${TARGET_P95_MS.page} ms) with 0 errors at ${RATE} requests/s`
        : `target missed by: ${failing.join("; ")}`,
    );
  } finally {
    await server.stop();
    build.remove();
    database.remove();
  }
}

await main();
