// Issue #13, finding 10 (clean-up): expired sessions and networks past their 30-day restore window
// were removed only when the process started. The clean-up now also runs on a timer.
import { describe, expect, it } from "vitest";
import { getDb } from "#app/lib/db.server.ts";
import { startHousekeeping } from "#app/lib/housekeeping.server.ts";
import { createNetwork } from "#app/lib/networks.server.ts";
import { insertSession } from "#db/sessions.ts";
import { makeUser } from "../routes/harness.ts";
import { demoDocument } from "../routes/reviewWorld.ts";

describe("the periodic clean-up", () => {
  it("removes, while the server keeps running, what expired after it started", async () => {
    const db = await getDb();
    const user = await makeUser("Hal Housekeeper", { ownTeam: true });
    const team = await db.selectFrom("memberships").select("team_id").where("user_id", "=", user.id).executeTakeFirstOrThrow();
    const session = await insertSession(db, user.id);
    const made = await createNetwork(db, { teamId: team.team_id, document: demoDocument("Long gone"), authorId: user.id });
    if (!made.ok) throw new Error("fixture network must validate");
    // Both expire after the database opened: the start-up clean-up cannot have seen them.
    const longAgo = new Date(Date.now() - 31 * 86_400_000).toISOString();
    await db.updateTable("sessions").set({ expires_at: new Date(Date.now() - 1000).toISOString() }).where("id", "=", session.id).execute();
    await db.updateTable("networks").set({ deleted_at: longAgo, deleted_by: user.id }).where("id", "=", made.network.id).execute();

    const stop = startHousekeeping(db, 20);
    try {
      for (let i = 0; i < 200; i++) {
        const left = await db.selectFrom("networks").select("id").where("id", "=", made.network.id).executeTakeFirst();
        if (!left) break;
        await new Promise((r) => setTimeout(r, 25));
      }
    } finally {
      stop();
    }
    expect(await db.selectFrom("networks").select("id").where("id", "=", made.network.id).executeTakeFirst()).toBeUndefined();
    expect(await db.selectFrom("sessions").select("id").where("id", "=", session.id).executeTakeFirst()).toBeUndefined();
  });
});
