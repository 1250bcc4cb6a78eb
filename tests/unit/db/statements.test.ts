// Kysely asks the connection for a statement on every query; the connection prepares each
// distinct SQL text once and hands back the kept statement after that.
import SQLite from "better-sqlite3";
import { describe, expect, it, vi } from "vitest";
import { openDatabase } from "#db/database.ts";

describe("the database connection", () => {
  it("prepares a statement once however often the same query runs", async () => {
    const prepare = vi.spyOn(SQLite.prototype, "prepare");
    const db = openDatabase(":memory:");
    const before = prepare.mock.calls.length;
    for (let i = 0; i < 5; i++) await db.selectNoFrom((eb) => eb.val(i).as("n")).execute();
    expect(prepare.mock.calls.length - before).toBe(1);
    const answers = await db.selectNoFrom((eb) => eb.val(42).as("n")).execute();
    expect(answers).toEqual([{ n: 42 }]); // the kept statement binds each query's own values
    await db.destroy();
    prepare.mockRestore();
  });
});
