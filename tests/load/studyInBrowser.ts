// The study of a 300-element network with 4 operating cases and full N-1, run from the study page
// in a real browser on the built server, while someone else asks a light page: `npm run
// bench:study-page`. The network is uploaded through the upload page (the benchmark's own
// 300-element feeder with four cases, tests/bench/study.ts); the editor opens its study page,
// ticks N-1 and runs it; the time from the click to the N-1 table is printed beside the machine's
// load average, with the light page's answers meanwhile (p50, p95 and the worst wait, measured
// from when each was due, so a held server counts). It prints; it never fails on a slow machine,
// only when a page does not answer or answers 5xx.
import { availableParallelism, loadavg } from "node:os";
import { chromium } from "@playwright/test";
import { DEMO_ACCOUNTS } from "#db/demoAccounts.ts";
import { ELEMENT_COLLECTIONS } from "#solver/elements.ts";
import { studyBenchDocument, STUDY_BENCH_ELEMENTS } from "../bench/study.ts";
import { copyBuild, freePort, seededDatabase, signInCookie, startServer } from "../tools/builtServer.ts";

/** How often the light page is asked while the study runs. */
const LIGHT_EVERY_MS = 100;
const LIGHT_PAGE = "/teams";

const load = () => loadavg().map((l) => l.toFixed(2)).join(" ");
const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.min(values.length - 1, Math.floor(p * values.length))];

const build = copyBuild();
const database = await seededDatabase();
// The study is paid from the editor's budget once; nothing here is about the budget.
const server = await startServer({ build, databasePath: database.databasePath, port: await freePort(), env: { SOLVE_RATE_LIMIT_PER_MINUTE: "100000" } });
const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium" });
let failures = 0;
try {
  const editor = DEMO_ACCOUNTS.find((a) => a.role === "editor")!;
  const viewer = DEMO_ACCOUNTS.find((a) => a.role === "viewer")!;
  const page = await browser.newPage({ baseURL: server.url, viewport: { width: 1280, height: 900 } });
  page.setDefaultTimeout(300_000);
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(editor.email);
  await page.getByLabel("Password").fill(editor.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/networks");

  const document = { ...studyBenchDocument(), name: `Study timing feeder of ${STUDY_BENCH_ELEMENTS} elements (fictional)` };
  const elements = ELEMENT_COLLECTIONS.reduce((n, key) => n + (document[key]?.length ?? 0), 0);
  await page.goto("/networks/upload");
  await page.getByLabel("Network file").setInputFiles({ name: "study-timing.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(document)) });
  await page.getByText("The file is a valid network.").waitFor();
  await page.getByRole("button", { name: "Create network" }).click();
  await page.getByRole("heading", { name: document.name, level: 1 }).waitFor();
  const networkId = Number(new URL(page.url()).pathname.split("/").pop());

  // The page runs the cases alone as it opens; N-1 is then asked for in its form.
  await page.goto(`/networks/${networkId}/study`);
  await page.getByRole("heading", { name: "Envelope across the cases" }).waitFor();
  await page.getByLabel(/Outages \(N-1\)/).check();

  const someoneElse = await signInCookie(server.url, viewer.email, viewer.password);
  let running = true;
  const light: { status: number; waitMs: number }[] = [];
  const askLight = async () => {
    while (running) {
      const due = performance.now() + LIGHT_EVERY_MS;
      await new Promise((done) => setTimeout(done, LIGHT_EVERY_MS));
      const response = await fetch(`${server.url}${LIGHT_PAGE}`, { headers: { Cookie: someoneElse } });
      await response.text();
      if (response.status >= 500) failures++;
      light.push({ status: response.status, waitMs: performance.now() - due });
    }
  };

  const loadBefore = load();
  const lightLoop = askLight();
  const started = performance.now();
  await page.getByRole("button", { name: "Run the study" }).click();
  await page.getByRole("heading", { name: "Outages (N-1)" }).waitFor();
  const studyMs = performance.now() - started;
  running = false;
  await lightLoop;
  const summary = (await page.getByText(/single outages of a line or transformer studied/).innerText()).trim();

  const waits = light.map((l) => l.waitMs);
  console.log(`machine: ${availableParallelism()} cores; load average before ${loadBefore}, after ${load()}`);
  console.log(
    `study page, ${elements} elements (${document.buses.length} buses), ${document.cases.length} operating cases, full N-1: ` +
      `${(studyMs / 1000).toFixed(1)} s from "Run the study" to the N-1 table in the browser`,
  );
  console.log(`  the page says: ${summary}`);
  console.log(
    `light page ${LIGHT_PAGE} asked by another account every ${LIGHT_EVERY_MS} ms meanwhile: ${light.length} answers ` +
      `(statuses ${[...new Set(light.map((l) => l.status))].join(", ")}), wait p50 ${percentile(waits, 0.5).toFixed(0)} ms, ` +
      `p95 ${percentile(waits, 0.95).toFixed(0)} ms, worst ${Math.max(...waits).toFixed(0)} ms`,
  );
} finally {
  await browser.close();
  await server.stop();
  build.remove();
  database.remove();
}
if (failures > 0) {
  console.error(`${failures} light page answer(s) were 5xx: a defect at any load.`);
  process.exitCode = 1;
}
