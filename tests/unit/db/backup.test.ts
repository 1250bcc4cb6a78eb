// Issue #13, finding 10 (operations): there was no backup or restore. `npm run backup` copies the
// live database with SQLite's online backup while the server writes; `npm run restore` checks a
// backup and puts it in place. Both are exercised here on the test's own database.
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { backupDatabase, checkDatabaseFile, restoreDatabase } from "#db/backup.ts";
import { openMigratedDatabase } from "#db/database.ts";
import { findUserByEmail } from "#db/users.ts";
import { makeUser } from "../app/routes/harness.ts";

const folder = mkdtempSync(join(tmpdir(), "kilostep-backup-"));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe("backup and restore", () => {
  it("backs up while writes go on, and the restored database serves what was saved", async () => {
    const db = await getDb();
    const before = await makeUser("Bea Backup");
    let writing = true;
    let written = 0;
    const writer = (async () => {
      while (writing) {
        await db.insertInto("sign_in_failures").values({ account: `writer.${written}@example.org`, address: null, failed_at: new Date().toISOString() }).execute();
        written++;
        await new Promise((r) => setImmediate(r));
      }
    })();
    const backupPath = join(folder, "nested", "kilostep.sqlite");
    await backupDatabase(process.env.DATABASE_PATH!, backupPath);
    writing = false;
    await writer;
    expect(written).toBeGreaterThan(0);
    checkDatabaseFile(backupPath);
    await expect(backupDatabase(process.env.DATABASE_PATH!, backupPath)).rejects.toThrow(/exists already/);

    const restoredPath = join(folder, "restored", "kilostep.sqlite");
    await restoreDatabase(backupPath, restoredPath);
    const restored = await openMigratedDatabase(restoredPath);
    try {
      expect((await findUserByEmail(restored, before.email))?.name).toBe("Bea Backup");
    } finally {
      await restored.destroy();
    }
  });

  it("refuses to restore a file that is not an intact Kilostep database", async () => {
    const junk = join(folder, "junk.sqlite");
    writeFileSync(junk, "not a database at all, just text that is long enough to look like a header");
    const target = join(folder, "target", "kilostep.sqlite");
    await expect(restoreDatabase(junk, target)).rejects.toThrow();
    expect(existsSync(target)).toBe(false);
  });
});
