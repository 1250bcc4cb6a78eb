import { Migrator, sql } from "kysely";
import { describe, expect, it } from "vitest";
import { migrateToLatest, openDatabase, openMigratedDatabase } from "#db/database.ts";
import { DEMO_ACCOUNTS, DEMO_TEAM_NAME } from "#db/demoAccounts.ts";
import { migrationProvider, migrations } from "#db/migrations/index.ts";
import { seedDemoData as seedDemo } from "#app/lib/demo/seed.server.ts";
import { validateNetwork } from "#solver/schema.ts";

const databasePath = () => `${process.env.DATABASE_PATH}.migrations-${Math.random().toString(36).slice(2)}`;

// The foundation's tables; later migrations add more, which these tests leave them free to do.
const FOUNDATION_TABLES = ["memberships", "network_revisions", "networks", "sessions", "sign_in_failures", "teams", "users"];

async function tableNames(db: ReturnType<typeof openDatabase>): Promise<string[]> {
  const rows = await sql<{ name: string }>`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like 'kysely_%' order by name`.execute(db);
  return rows.rows.map((r) => r.name);
}

describe("migrations", () => {
  it("bring a fresh database to the latest version with every table", async () => {
    const db = openDatabase(databasePath());
    const applied = await migrateToLatest(db);
    expect(applied).toEqual(Object.keys(migrations));
    expect(await tableNames(db)).toEqual(expect.arrayContaining(FOUNDATION_TABLES));
    expect(await migrateToLatest(db)).toEqual([]);
    await db.destroy();
  });

  it("are named YYYY-MM-DD-NN-what and listed in order", () => {
    const names = Object.keys(migrations);
    for (const name of names) expect(name).toMatch(/^\d{4}-\d{2}-\d{2}-\d{2}-[a-z0-9-]+$/);
    expect([...names].sort()).toEqual(names);
  });

  it("set WAL, foreign keys and a busy timeout on the connection", async () => {
    const db = openDatabase(databasePath());
    const journal = await sql<{ journal_mode: string }>`pragma journal_mode`.execute(db);
    const foreignKeys = await sql<{ foreign_keys: number }>`pragma foreign_keys`.execute(db);
    const busy = await sql<{ timeout: number }>`pragma busy_timeout`.execute(db);
    expect(journal.rows[0].journal_mode).toBe("wal");
    expect(foreignKeys.rows[0].foreign_keys).toBe(1);
    expect(busy.rows[0].timeout).toBeGreaterThanOrEqual(1000);
    await db.destroy();
  });

  it("go down to nothing and up again", async () => {
    const db = await openMigratedDatabase(databasePath());
    const migrator = new Migrator({ db, provider: migrationProvider });
    for (let i = 0; i < Object.keys(migrations).length; i++) {
      const { error } = await migrator.migrateDown();
      expect(error).toBeUndefined();
    }
    expect(await tableNames(db)).toEqual([]);
    await migrateToLatest(db);
    expect(await tableNames(db)).toEqual(expect.arrayContaining(FOUNDATION_TABLES));
    await db.destroy();
  });

  it("enforce foreign keys and the one-role rule", async () => {
    const db = await openMigratedDatabase(databasePath());
    await expect(
      db.insertInto("memberships").values({ team_id: 99, user_id: 99, role: "owner", created_at: "2026-01-01T00:00:00.000Z" }).execute(),
    ).rejects.toThrow(/FOREIGN KEY/);
    const at = "2026-01-01T00:00:00.000Z";
    const user = await db.insertInto("users").values({ email: "a@example.org", name: "A", password_hash: "x", created_at: at }).returning("id").executeTakeFirstOrThrow();
    const team = await db.insertInto("teams").values({ name: "T", created_at: at }).returning("id").executeTakeFirstOrThrow();
    await expect(
      db.insertInto("memberships").values({ team_id: team.id, user_id: user.id, role: "admin" as "owner", created_at: at }).execute(),
    ).rejects.toThrow(/CHECK/);
    await db.destroy();
  });
});

describe("the demo seed", () => {
  it("creates the demo team, its three roles and two valid networks, and a second run changes nothing", async () => {
    const db = await openMigratedDatabase(databasePath());
    const first = await seedDemo(db);
    expect(first.created).toEqual({ users: 3, teams: 1, memberships: 3, networks: 2 });

    const count = async (table: "users" | "teams" | "memberships" | "networks" | "network_revisions") =>
      Number((await db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);
    const before = {
      users: await count("users"),
      teams: await count("teams"),
      memberships: await count("memberships"),
      networks: await count("networks"),
      revisions: await count("network_revisions"),
    };

    const second = await seedDemo(db);
    expect(second.created).toEqual({ users: 0, teams: 0, memberships: 0, networks: 0 });
    expect(second.teamId).toBe(first.teamId);
    expect({
      users: await count("users"),
      teams: await count("teams"),
      memberships: await count("memberships"),
      networks: await count("networks"),
      revisions: await count("network_revisions"),
    }).toEqual(before);

    const team = await db.selectFrom("teams").selectAll().where("id", "=", first.teamId).executeTakeFirstOrThrow();
    expect(team.name).toBe(DEMO_TEAM_NAME);
    const roles = await db
      .selectFrom("memberships as m")
      .innerJoin("users as u", "u.id", "m.user_id")
      .select(["u.email", "m.role"])
      .where("m.team_id", "=", team.id)
      .orderBy("u.email")
      .execute();
    expect(roles).toEqual(
      DEMO_ACCOUNTS.map((a) => ({ email: a.email, role: a.role })).sort((a, b) => a.email.localeCompare(b.email)),
    );

    const revisions = await db.selectFrom("network_revisions").select(["document"]).execute();
    expect(revisions).toHaveLength(2);
    for (const revision of revisions) expect(validateNetwork(JSON.parse(revision.document)).ok).toBe(true);
    await db.destroy();
  });
});
