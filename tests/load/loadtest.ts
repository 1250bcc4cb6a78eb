// Load test: the built server on loopback, autocannon with 50 connections for 20 s on each of the
// networks page, the sheet's loader, the solve API and the results CSV export. Prints p50, p95,
// p99 and errors per target. Run: `npm run loadtest` (it builds first; LOADTEST_SECONDS shortens it).
import { readFileSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import autocannon, { type Result } from "autocannon";
import { DEMO_ACCOUNTS } from "#db/demoAccounts.ts";
import { copyBuild, freePort, seededDatabase, signInCookie, startServer } from "../tools/builtServer.ts";

const CONNECTIONS = 50;
const SECONDS = Number(process.env.LOADTEST_SECONDS ?? 20);
const TARGET_P95_MS = 50;

interface Target {
  name: string;
  path: string;
  method?: string;
  body?: string;
  contentType?: string;
}

interface Figures {
  name: string;
  requests: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  statuses: string;
}

/** The q-quantile of sorted latencies by the nearest-rank method. */
function quantile(sorted: number[], q: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)];
}

async function measure(url: string, cookie: string, target: Target): Promise<Figures> {
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  const instance = autocannon({
    url: `${url}${target.path}`,
    connections: CONNECTIONS,
    duration: SECONDS,
    method: target.method ?? "GET",
    headers: { Cookie: cookie, Origin: url, ...(target.contentType ? { "Content-Type": target.contentType } : {}) },
    body: target.body,
    timeout: 10,
  });
  instance.on("response", (_client, statusCode, _bytes, responseTime) => {
    latencies.push(responseTime);
    statuses.set(statusCode, (statuses.get(statusCode) ?? 0) + 1);
  });
  const result = await new Promise<Result>((done) => instance.on("done", done));
  latencies.sort((a, b) => a - b);
  return {
    name: target.name,
    requests: latencies.length,
    perSecond: latencies.length / result.duration,
    p50: quantile(latencies, 0.5),
    p95: quantile(latencies, 0.95),
    p99: quantile(latencies, 0.99),
    errors: result.errors + result.timeouts + result.non2xx,
    statuses: [...statuses].map(([status, count]) => `${status}×${count}`).join(" "),
  };
}

function table(rows: Figures[]): string {
  const header = ["target", "requests", "req/s", "p50 ms", "p95 ms", "p99 ms", "errors", `p95 ≤ ${TARGET_P95_MS} ms`, "statuses"];
  const lines = rows.map((r) => [
    r.name,
    String(r.requests),
    r.perSecond.toFixed(0),
    r.p50.toFixed(1),
    r.p95.toFixed(1),
    r.p99.toFixed(1),
    String(r.errors),
    r.p95 <= TARGET_P95_MS && r.errors === 0 ? "yes" : "NO",
    r.statuses,
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i].length)));
  const format = (cells: string[]) => `| ${cells.map((c, i) => c.padEnd(widths[i])).join(" | ")} |`;
  return [format(header), format(widths.map((w) => "-".repeat(w))), ...lines.map(format)].join("\n");
}

async function main() {
  const build = copyBuild();
  const database = await seededDatabase();
  // The solve API's per-account budget would turn most of this test into 429s; the limiter is
  // tested on its own, here the server's speed is measured.
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
      { name: "networks page GET /networks", path: "/networks" },
      { name: `sheet loader GET /networks/${network.id}.data`, path: `/networks/${network.id}.data` },
      { name: "solve API POST /api/solve", path: "/api/solve", method: "POST", body: fixture, contentType: "application/json" },
      { name: "CSV export GET …/results.csv?table=buses", path: `/api/networks/${network.id}/results.csv?table=buses` },
    ];
    console.log(`load test: ${CONNECTIONS} connections, ${SECONDS} s per target, against ${server.url} (built app, NODE_ENV=production)`);
    const rows: Figures[] = [];
    for (const target of targets) {
      const check = await fetch(`${server.url}${target.path}`, {
        method: target.method ?? "GET",
        headers: { Cookie: cookie, Origin: server.url, ...(target.contentType ? { "Content-Type": target.contentType } : {}) },
        body: target.body,
      });
      if (!check.ok) console.log(`note: ${target.name} answers ${check.status} before the run`);
      rows.push(await measure(server.url, cookie, target));
      console.log(`  measured ${target.name}`);
    }
    console.log(table(rows));
    // With every connection kept busy, mean latency = connections ÷ throughput (Little's law), so
    // the figures above are as much about this machine's cores as about the server.
    console.log(
      `context: ${availableParallelism()} cores, load average ${loadavg().map((l) => l.toFixed(1)).join(" / ")}; ` +
        `with ${CONNECTIONS} connections a mean of 50 ms needs ${CONNECTIONS / 0.05} req/s (Little's law)`,
    );
    const failing = rows.filter((r) => r.p95 > TARGET_P95_MS || r.errors > 0).map((r) => r.name);
    console.log(failing.length === 0 ? "every target met p95 ≤ 50 ms with 0 errors" : `target missed by: ${failing.join("; ")}`);
  } finally {
    await server.stop();
    build.remove();
    database.remove();
  }
}

await main();
