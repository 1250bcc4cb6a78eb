// Backup and restore of the SQLite file.
//   npm run backup [-- FILE]   copies the live database to FILE (default: backups/kilostep-<time>.sqlite
//                              in the database's folder)
//                              with SQLite's online backup: safe while the server runs and writes.
//   npm run restore -- FILE    checks FILE and copies it over DATABASE_PATH. Stop the server first:
//                              a running server keeps its own view of the old file.
// Both read DATABASE_PATH like the server (default data/kilostep.sqlite).
import { existsSync, mkdirSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { pathToFileURL } from "node:url";
import SQLite from "better-sqlite3";

/** Copies the database at `sourcePath` to `targetPath` page by page, letting writers in between. */
export async function backupDatabase(sourcePath: string, targetPath: string): Promise<void> {
  if (!existsSync(sourcePath)) throw new Error(`There is no database at ${sourcePath}.`);
  if (existsSync(targetPath)) throw new Error(`${targetPath} exists already; choose a new file for the backup.`);
  mkdirSync(dirname(resolve(targetPath)), { recursive: true });
  const source = new SQLite(sourcePath, { fileMustExist: true });
  source.pragma("busy_timeout = 5000");
  try {
    await source.backup(targetPath);
  } finally {
    source.close();
  }
  checkDatabaseFile(targetPath);
}

/** Throws unless the file is an intact SQLite database with Kilostep's tables. */
export function checkDatabaseFile(path: string): void {
  const db = new SQLite(path, { readonly: true, fileMustExist: true });
  try {
    const integrity = db.pragma("integrity_check", { simple: true });
    if (integrity !== "ok") throw new Error(`${path} is damaged: ${String(integrity)}`);
    const tables = db.prepare("select name from sqlite_master where type = 'table' and name in ('users', 'networks', 'kysely_migration')").all();
    if (tables.length !== 3) throw new Error(`${path} is not a Kilostep database (its tables are missing).`);
  } finally {
    db.close();
  }
}

/** Checks the backup, then writes it over the database at `targetPath` (its WAL included). */
export async function restoreDatabase(backupPath: string, targetPath: string): Promise<void> {
  checkDatabaseFile(backupPath);
  mkdirSync(dirname(resolve(targetPath)), { recursive: true });
  const backup = new SQLite(backupPath, { readonly: true, fileMustExist: true });
  try {
    // Through SQLite rather than a file copy, so a -wal file beside the old database cannot outlive it.
    await backup.backup(targetPath);
  } finally {
    backup.close();
  }
  checkDatabaseFile(targetPath);
}

function databasePath(): string {
  return process.env.DATABASE_PATH?.trim() || "data/kilostep.sqlite";
}

async function main() {
  const [command, file] = process.argv.slice(2);
  if (command === "backup") {
    const target = file ?? join(dirname(databasePath()), "backups", `kilostep-${new Date().toISOString().replace(/[:.]/g, "-")}.sqlite`);
    await backupDatabase(databasePath(), target);
    console.log(`Backed up ${databasePath()} to ${target} (checked intact).`);
  } else if (command === "restore" && file) {
    await restoreDatabase(file, databasePath());
    console.log(`Restored ${databasePath()} from ${file}. Start the server again.`);
  } else {
    console.log("Usage: npm run backup [-- FILE]   or   npm run restore -- FILE (with the server stopped)");
    process.exitCode = 1;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  try {
    await main();
  } catch (error) {
    console.log(error instanceof Error ? error.message : String(error));
    process.exitCode = 1;
  }
}
