// The built app (run `npm run build` first) served by app/server.ts on a throwaway database
// seeded with the demo, for the tools that need a real server: the crash check and the load test.
// Like the browser tests' server, it serves a private copy of build/ so that a rebuild in the
// working tree cannot pull files from under it; the copy sits in node_modules/.cache so the server
// bundle still resolves its packages.
import { spawn, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { cpSync, existsSync, mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { pathToFileURL } from "node:url";

export interface ServedBuild {
  /** Folder with the private copy of build/. */
  folder: string;
  remove(): void;
}

export function copyBuild(): ServedBuild {
  if (!existsSync("build/server/index.js")) throw new Error("There is no build: run `npm run build` first.");
  mkdirSync("node_modules/.cache", { recursive: true });
  const folder = mkdtempSync(resolve("node_modules/.cache/kilostep-tool-"));
  cpSync("build", join(folder, "build"), { recursive: true });
  return { folder, remove: () => rmSync(folder, { recursive: true, force: true }) };
}

/** A migrated database with the demo team, its three people and the two demo networks. */
export async function seededDatabase(): Promise<{ databasePath: string; remove(): void }> {
  const folder = mkdtempSync(join(tmpdir(), "kilostep-tool-db-"));
  const databasePath = join(folder, "tool.sqlite");
  // A throwaway database needs no full-cost password hashes; bcrypt reads the cost from each hash,
  // so the demo accounts then sign in quickly on the production server too.
  process.env.NODE_ENV ??= "test";
  if (process.env.NODE_ENV === "test") process.env.PASSWORD_HASH_COST ??= "4";
  const { openMigratedDatabase } = await import("#db/database.ts");
  const { seedDemoData } = await import("#app/lib/demo/seed.server.ts");
  const db = await openMigratedDatabase(databasePath);
  await seedDemoData(db);
  await db.destroy();
  return { databasePath, remove: () => rmSync(folder, { recursive: true, force: true }) };
}

export async function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer();
    probe.once("error", fail);
    probe.listen(0, "127.0.0.1", () => {
      const address = probe.address();
      probe.close(() => (typeof address === "object" && address ? done(address.port) : fail(new Error("no port"))));
    });
  });
}

/** Node's arguments that run the production server (app/server.ts) on the build in `cwd`. */
export function serverArguments(): string[] {
  return ["--import", pathToFileURL(resolve("node_modules/tsx/dist/loader.mjs")).href, resolve("app/server.ts"), "./build/server/index.js"];
}

export interface RunningServer {
  url: string;
  child: ChildProcess;
  /** What the server printed on stdout so far (its access log), when asked to keep it. */
  output: string[];
  /** Ends the server politely and waits for it. */
  stop(): Promise<void>;
  /** Ends it the hard way, as a power cut or an OOM kill would: SIGKILL, no cleanup. */
  kill9(): Promise<void>;
}

export const SESSION_SECRET = randomBytes(32).toString("hex");

export async function startServer(options: {
  build: ServedBuild;
  databasePath: string;
  port: number;
  env?: Record<string, string>;
  keepOutput?: boolean;
}): Promise<RunningServer> {
  const url = `http://127.0.0.1:${options.port}`;
  const inherited = { ...process.env };
  // The seeding process may lower the hash cost for itself; a production server refuses that setting.
  delete inherited.PASSWORD_HASH_COST;
  const child = spawn(process.execPath, serverArguments(), {
    cwd: options.build.folder,
    stdio: ["ignore", options.keepOutput ? "pipe" : "ignore", "inherit"],
    env: {
      ...inherited,
      NODE_ENV: "production",
      DATABASE_PATH: options.databasePath,
      SESSION_SECRET,
      PORT: String(options.port),
      HOST: "127.0.0.1",
      APP_ORIGIN: url,
      ...options.env,
    },
  });
  const output: string[] = [];
  child.stdout?.setEncoding("utf8").on("data", (chunk: string) => output.push(...chunk.split("\n").filter(Boolean)));
  const exited = new Promise<void>((done) => child.once("exit", () => done()));
  // Generous: a loaded machine takes a while to compile the server and load the build.
  const deadline = Date.now() + 90_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`The server exited with status ${child.exitCode} while starting.`);
    try {
      const response = await fetch(`${url}/sign-in`);
      if (response.ok) break;
    } catch {
      // Not listening yet.
    }
    if (Date.now() > deadline) {
      child.kill("SIGKILL");
      throw new Error("The server did not answer within 90 s.");
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  return {
    url,
    child,
    output,
    async stop() {
      if (child.exitCode === null) child.kill("SIGTERM");
      await exited;
    },
    async kill9() {
      if (child.exitCode === null) child.kill("SIGKILL");
      await exited;
    },
  };
}

/** Signs in through the real form and returns the Cookie header a browser would send afterwards. */
export async function signInCookie(url: string, email: string, password: string): Promise<string> {
  const response = await fetch(`${url}/sign-in`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: url },
    body: new URLSearchParams({ email, password }),
  });
  const setCookie = response.headers.get("Set-Cookie");
  if (!setCookie) throw new Error(`Signing in as ${email} failed with status ${response.status}.`);
  return setCookie.split(";")[0];
}
