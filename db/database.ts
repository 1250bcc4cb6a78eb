// Opening the SQLite file: every connection gets WAL (readers never wait on the writer),
// foreign keys (SQLite leaves them off by default) and a busy timeout (a second process such as
// the seed script waits instead of failing).
import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import SQLite from "better-sqlite3";
import { Kysely, Migrator, SqliteDialect } from "kysely";
import { migrationProvider } from "./migrations/index.ts";
import type { Database } from "./schema.ts";

export type Db = Kysely<Database>;

/** Statements kept prepared; the app issues far fewer distinct ones than this. */
const KEPT_STATEMENTS = 500;

/**
 * The connection as Kysely sees it, with each distinct SQL text prepared once and kept: Kysely
 * asks for a new statement per query, and preparing costs several times what running a small
 * query does. Queries with the same text differ only in their parameters, which run() binds.
 */
function keepingStatements(sqlite: SQLite.Database) {
  const kept = new Map<string, SQLite.Statement>();
  return {
    close: () => sqlite.close(),
    prepare(sql: string): SQLite.Statement {
      let statement = kept.get(sql);
      if (statement) {
        kept.delete(sql);
      } else {
        statement = sqlite.prepare(sql);
        if (kept.size >= KEPT_STATEMENTS) kept.delete(kept.keys().next().value!);
      }
      kept.set(sql, statement);
      return statement;
    },
  };
}

export function openDatabase(path: string): Db {
  if (path !== ":memory:") mkdirSync(dirname(path), { recursive: true });
  const sqlite = new SQLite(path);
  sqlite.pragma("journal_mode = WAL");
  sqlite.pragma("foreign_keys = ON");
  sqlite.pragma("busy_timeout = 5000");
  return new Kysely<Database>({ dialect: new SqliteDialect({ database: keepingStatements(sqlite) }) });
}

/** Apply every pending migration; returns the names applied now. */
export async function migrateToLatest(db: Db): Promise<string[]> {
  const migrator = new Migrator({ db, provider: migrationProvider });
  const { error, results = [] } = await migrator.migrateToLatest();
  if (error) {
    const failed = results.find((r) => r.status === "Error")?.migrationName ?? "(before any migration ran)";
    throw new Error(`Database migration ${failed} failed: ${error instanceof Error ? error.message : String(error)}`, {
      cause: error,
    });
  }
  return results.filter((r) => r.status === "Success").map((r) => r.migrationName);
}

export async function openMigratedDatabase(path: string): Promise<Db> {
  const db = openDatabase(path);
  await migrateToLatest(db);
  return db;
}
