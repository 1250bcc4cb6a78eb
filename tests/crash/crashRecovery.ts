// Crash check: writers save revisions through the API as fast as they can while the server is
// killed with SIGKILL at a random moment; after a restart SQLite must report its file intact and
// every save the server acknowledged (answered 200) must be there with its content. Three rounds.
// Run: `npm run build && npx tsx tests/crash/crashRecovery.ts` (the browser tests run it too).
import SQLite from "better-sqlite3";
import { DEMO_ACCOUNTS } from "#db/demoAccounts.ts";
import { copyBuild, freePort, seededDatabase, signInCookie, startServer, type RunningServer } from "../tools/builtServer.ts";

const ROUNDS = 3;
const WRITERS = 3;

interface Acknowledged {
  networkId: number;
  revision: number;
  /** The value this save wrote into the first load's pMW, to recognise its document. */
  markerMW: number;
}

interface Tally {
  acknowledged: Acknowledged[];
  conflicts: number;
  /** Requests cut off by the kill: they may or may not have committed. */
  unanswered: number;
}

type NetworkDocument = { loads: { pMW: number }[] } & Record<string, unknown>;

/** A JSON answer, or null when the connection was cut before the whole answer arrived. */
async function answer(request: Promise<Response>): Promise<{ status: number; body: unknown } | null> {
  try {
    const response = await request;
    const text = await response.text();
    return { status: response.status, body: text ? (JSON.parse(text) as unknown) : null };
  } catch {
    return null;
  }
}

async function writer(server: RunningServer, cookie: string, networkId: number, tally: Tally, stop: { now: boolean }) {
  const headers = { "Content-Type": "application/json", Cookie: cookie, Origin: server.url };
  const read = async () => (await answer(fetch(`${server.url}/api/networks/${networkId}`, { headers })))?.body as
    | { revision: number; document: NetworkDocument }
    | undefined;
  let current = await read();
  let step = 0;
  while (current && !stop.now) {
    step++;
    const markerMW = Number((1 + networkId + step / 1000).toFixed(3));
    const document = structuredClone(current.document);
    document.loads[0].pMW = markerMW;
    const saved = await answer(
      fetch(`${server.url}/api/networks/${networkId}`, { method: "PUT", headers, body: JSON.stringify({ revision: current.revision, document }) }),
    );
    // No complete answer: the save may or may not have committed, but it was not acknowledged.
    if (saved === null) {
      tally.unanswered++;
      return;
    }
    if (saved.status === 200) {
      const body = saved.body as { revision: number; document: NetworkDocument };
      tally.acknowledged.push({ networkId, revision: body.revision, markerMW });
      current = { revision: body.revision, document: body.document };
    } else if (saved.status === 409) {
      tally.conflicts++;
      current = await read();
    } else {
      throw new Error(`A save answered ${saved.status}: ${JSON.stringify(saved.body)}`);
    }
  }
  if (!current) tally.unanswered++;
}

function verify(databasePath: string, acknowledged: Acknowledged[]): { integrity: string; missing: Acknowledged[] } {
  const sqlite = new SQLite(databasePath, { readonly: true });
  try {
    const integrity = (sqlite.pragma("integrity_check", { simple: true }) as string) ?? "no answer";
    const read = sqlite.prepare("select document from network_revisions where network_id = ? and number = ?");
    const missing = acknowledged.filter((ack) => {
      const row = read.get(ack.networkId, ack.revision) as { document: string } | undefined;
      return !row || (JSON.parse(row.document) as NetworkDocument).loads[0].pMW !== ack.markerMW;
    });
    return { integrity, missing };
  } finally {
    sqlite.close();
  }
}

async function main() {
  const started = Date.now();
  const build = copyBuild();
  const database = await seededDatabase();
  const port = await freePort();
  const editor = DEMO_ACCOUNTS.find((a) => a.role === "editor")!;
  let failures = 0;
  const all: Acknowledged[] = [];
  let server = await startServer({ build, databasePath: database.databasePath, port });
  try {
    const cookie = await signInCookie(server.url, editor.email, editor.password);
    const listed = (await (await fetch(`${server.url}/api/networks`, { headers: { Cookie: cookie } })).json()) as {
      networks: { id: number }[];
    };
    const networkIds = listed.networks.map((n) => n.id);
    if (networkIds.length === 0) throw new Error("The demo has no networks to save.");

    for (let round = 1; round <= ROUNDS; round++) {
      const tally: Tally = { acknowledged: [], conflicts: 0, unanswered: 0 };
      const stop = { now: false };
      // Two writers share the first network, so conflicts (409) happen as well as saves.
      const targets = Array.from({ length: WRITERS }, (_, i) => networkIds[i % networkIds.length]);
      const writers = targets.map((id) => writer(server, cookie, id, tally, stop));
      const killAfterMs = 800 + Math.floor(Math.random() * 1700);
      await new Promise((r) => setTimeout(r, killAfterMs));
      await server.kill9();
      stop.now = true;
      await Promise.all(writers);

      server = await startServer({ build, databasePath: database.databasePath, port });
      all.push(...tally.acknowledged);
      const { integrity, missing } = verify(database.databasePath, all);
      const answering = (await fetch(`${server.url}/api/networks/${networkIds[0]}`, { headers: { Cookie: cookie } })).status;
      const ok = integrity === "ok" && missing.length === 0 && answering === 200;
      if (!ok) failures++;
      console.log(
        `round ${round}: killed after ${killAfterMs} ms; ${tally.acknowledged.length} saves acknowledged, ${tally.conflicts} answered 409, ` +
          `${tally.unanswered} cut off; after restart: integrity_check ${integrity}, acknowledged saves missing ${missing.length} of ${all.length}, ` +
          `server answers ${answering}`,
      );
      for (const lost of missing.slice(0, 5)) console.log(`  lost: network ${lost.networkId} revision ${lost.revision}`);
    }
  } finally {
    await server.stop();
    build.remove();
    database.remove();
  }
  console.log(`crash check: ${ROUNDS} kills, ${all.length} acknowledged saves, ${failures === 0 ? "all present, database intact" : `${failures} round(s) failed`} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
  process.exit(failures === 0 ? 0 : 1);
}

await main();
