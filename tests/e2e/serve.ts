// The browser tests' server: the BUILT app (run `npm run build` first) on a throwaway database
// that is migrated and seeded with the demo, in production mode with a random session secret.
// It serves a private copy of build/, so a rebuild in the working tree during the run cannot pull
// the assets from under the browser; the copy sits inside node_modules so that the server bundle
// still resolves its packages. Both temporary folders go when Playwright stops the server.
// Mail goes over SMTP to a catcher in this process (production has no mail fake); the specs read
// it at the address this script leaves in mailboxFileFor(port).
import { spawn } from "node:child_process";
import { randomBytes } from "node:crypto";
import { cpSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { serverArguments } from "../tools/builtServer.ts";
import { startMailCatcher } from "../tools/mailCatcher.ts";
import { mailboxFileFor } from "./mailbox.ts";

const port = process.env.PORT ?? "3111";
const folder = mkdtempSync(join(tmpdir(), "kilostep-e2e-"));
mkdirSync("node_modules/.cache", { recursive: true });
const served = mkdtempSync(resolve("node_modules/.cache/kilostep-e2e-"));
// Registered first, so that a failure anywhere below still leaves no temporary folder behind.
process.on("exit", () => {
  rmSync(folder, { recursive: true, force: true });
  rmSync(served, { recursive: true, force: true });
  rmSync(mailboxFileFor(port), { force: true });
});
cpSync("build", join(served, "build"), { recursive: true });
const databasePath = join(folder, "e2e.sqlite");
process.env.DATABASE_PATH = databasePath;
// Seeding reads the app's environment module; as in `npm run demo`, it runs in development mode.
process.env.NODE_ENV = "development";

const { openMigratedDatabase } = await import("#db/database.ts");
const { seedDemoData } = await import("#app/lib/demo/seed.server.ts");
const db = await openMigratedDatabase(databasePath);
await seedDemoData(db);
await db.destroy();

const catcher = await startMailCatcher();
writeFileSync(mailboxFileFor(port), catcher.mailboxUrl);

const server = spawn(process.execPath, serverArguments(), {
  cwd: served,
  stdio: "inherit",
  env: {
    ...process.env,
    NODE_ENV: "production",
    DATABASE_PATH: databasePath,
    SESSION_SECRET: randomBytes(32).toString("hex"),
    PORT: port,
    APP_ORIGIN: `http://localhost:${port}`,
    SMTP_URL: catcher.smtpUrl,
  },
});

function stop() {
  server.kill("SIGTERM");
  process.exit(0);
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
server.on("exit", (code) => process.exit(code ?? 1));
