// Every page and download of one large network, on the built server: `npm run bench:pages`
// (BIG_NETWORK_BUSES sets the size, 10,000 by default). The network is made through the API as a
// planner's script would; then each address is asked once cold and once again warm, with the
// status, the time and the size of each answer printed beside the machine's load. It prints; it
// never fails, except when the server answers 5xx, which is a defect at any size.
import { availableParallelism, loadavg } from "node:os";
import { DEMO_ACCOUNTS } from "#db/demoAccounts.ts";
import { syntheticFeeder } from "../bench/syntheticFeeder.ts";
import { copyBuild, freePort, seededDatabase, signInCookie, startServer } from "../tools/builtServer.ts";

const BUSES = Number(process.env.BIG_NETWORK_BUSES ?? 10_000);

/** Issue 12's targets for a 10,000-bus network, judged on the warm figure (a page seen before in this process). */
const TARGETS_MS: Record<string, number> = { "/networks/ID": 500, "/networks/ID.data": 100 };

async function timed(url: string, init: RequestInit): Promise<{ status: number; ms: number; bytes: number; body: string }> {
  const started = performance.now();
  const response = await fetch(url, init);
  const body = await response.text();
  return { status: response.status, ms: performance.now() - started, bytes: Buffer.byteLength(body), body };
}

const load = () => loadavg().map((l) => l.toFixed(2)).join(" ");

const build = copyBuild();
const database = await seededDatabase();
const server = await startServer({ build, databasePath: database.databasePath, port: await freePort() });
let failures = 0;
try {
  const editor = DEMO_ACCOUNTS.find((a) => a.role === "editor")!;
  const cookie = await signInCookie(server.url, editor.email, editor.password);
  const headers = { Cookie: cookie, Origin: server.url };
  const document = { ...syntheticFeeder(BUSES), name: `Big feeder of ${BUSES} buses (fictional)` };
  const made = await timed(`${server.url}/api/networks`, { method: "POST", headers: { ...headers, "Content-Type": "application/json" }, body: JSON.stringify(document) });
  if (made.status !== 201) throw new Error(`creating the network answered ${made.status}: ${made.body.slice(0, 300)}`);
  const { id } = JSON.parse(made.body) as { id: number };
  const share = await timed(`${server.url}/api/networks/${id}/shares`, { method: "POST", headers: { ...headers, "Content-Type": "application/json" }, body: JSON.stringify({ role: "viewer" }) });
  const shareUrl = share.status === 201 ? (JSON.parse(share.body) as { url: string }).url : null;
  const token = shareUrl ? new URL(shareUrl).pathname : null;

  console.log(`A ${BUSES.toLocaleString("en-GB")}-bus network (${(Buffer.byteLength(JSON.stringify(document)) / 1e6).toFixed(1)} MB) made through the API in ${made.ms.toFixed(0)} ms`);
  console.log(`machine: ${availableParallelism()} cores, load average ${load()}\n`);
  const addresses = [
    "/networks",
    `/networks/${id}`,
    `/networks/${id}.data`,
    `/networks/${id}/report`,
    `/networks/${id}/ladder`,
    `/networks/${id}/study`,
    `/networks/${id}/revisions`,
    `/networks/${id}/share`,
    `/networks/${id}/loads-import`,
    `/api/networks/${id}`,
    `/api/networks/${id}/results.csv?table=buses`,
    `/api/networks/${id}/results.csv?table=branches`,
    `/api/networks/${id}/export`,
    ...(token ? [token, `${token}/report`, `${token}/results.csv?table=buses`] : []),
  ];
  console.log("address".padEnd(48), "status", "cold ms".padStart(9), "warm ms".padStart(9), "size".padStart(10), "  target (warm)");
  const verdicts: string[] = [];
  // The sheet page leaves a large document out of the page; the browser fetches it from the address the page names.
  const pageData = await timed(`${server.url}/networks/${id}.data`, { headers });
  const documentPath = /\/networks\/\d+\/document\?v=[^"\\]+/.exec(pageData.body)?.[0];
  if (documentPath) addresses.splice(addresses.indexOf(`/networks/${id}.data`) + 1, 0, documentPath);
  for (const path of addresses) {
    const cold = await timed(`${server.url}${path}`, { headers });
    const warm = await timed(`${server.url}${path}`, { headers });
    if (cold.status >= 500 || warm.status >= 500) failures++;
    const size = cold.bytes > 1e6 ? `${(cold.bytes / 1e6).toFixed(1)} MB` : `${(cold.bytes / 1e3).toFixed(0)} kB`;
    const shown = path.replace(String(id), "ID").replace(/document\?v=.*/, "document?v=…");
    const target = TARGETS_MS[shown];
    const verdict = target === undefined ? "" : `  ≤ ${target} ms: ${warm.ms <= target ? "PASS" : "over"}`;
    if (target !== undefined) verdicts.push(`${shown} ${warm.ms.toFixed(0)} ms (target ≤ ${target} ms): ${warm.ms <= target ? "PASS" : "over"}`);
    console.log(shown.slice(0, 48).padEnd(48), String(cold.status).padStart(6), cold.ms.toFixed(0).padStart(9), warm.ms.toFixed(0).padStart(9), size.padStart(10), verdict);
  }
  console.log(`\ntargets (${BUSES.toLocaleString("en-GB")} buses; issue 12 sets them at 10,000): ${verdicts.join("; ")}`);
  console.log(`load average at the end: ${load()}`);
} finally {
  await server.stop();
  build.remove();
  database.remove();
}
if (failures > 0) {
  console.error(`${failures} address(es) answered 5xx: a defect at any size.`);
  process.exitCode = 1;
}
