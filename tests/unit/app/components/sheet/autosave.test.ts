import { readFileSync } from "node:fs";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { AUTOSAVE_DELAY_MS, startAutosave, type AutosaveEnvironment } from "#app/components/sheet/autosave.ts";
import { readDraft } from "#app/components/sheet/draftStorage.ts";
import { createSheetStore } from "#app/components/sheet/sheetStore.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

class MemoryStorage {
  items = new Map<string, string>();
  get length() {
    return this.items.size;
  }
  key(i: number) {
    return [...this.items.keys()][i] ?? null;
  }
  getItem(key: string) {
    return this.items.get(key) ?? null;
  }
  setItem(key: string, value: string) {
    this.items.set(key, value);
  }
  removeItem(key: string) {
    this.items.delete(key);
  }
}

interface Call {
  method: string;
  url: string;
  body?: { revision: number; document: Network };
}

function setup(answers: ((call: Call) => Response | Promise<Response>)[]) {
  const calls: Call[] = [];
  const storage = new MemoryStorage();
  let online = true;
  let onlineCallback = () => {};
  const env: AutosaveEnvironment = {
    fetch: (async (url: string, init?: RequestInit) => {
      const call: Call = { method: init?.method ?? "GET", url, body: init?.body ? JSON.parse(String(init.body)) : undefined };
      calls.push(call);
      const answer = answers.shift();
      if (!answer) throw new Error("no answer prepared");
      return answer(call);
    }) as typeof fetch,
    storage,
    isOnline: () => online,
    onOnline: (callback) => {
      onlineCallback = callback;
      return () => undefined;
    },
    now: () => new Date("2030-01-01T12:00:00Z"),
  };
  const store = createSheetStore({ networkId: "12", document: demo(), revision: 3, readOnly: false });
  const saver = startAutosave(store, env);
  return {
    calls,
    storage,
    store,
    saver,
    goOffline: () => (online = false),
    goOnline: () => {
      online = true;
      onlineCallback();
    },
  };
}

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } });

const editLoad = (store: ReturnType<typeof createSheetStore>, pMW: number) => {
  const load = store.getState().document.loads[0];
  store.getState().actions.updateElement(load.id, { ...load, pMW });
};

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe("autosave", () => {
  it("saves a burst of edits once, with the revision they were made on", async () => {
    const t = setup([(call) => json(200, { revision: 4, document: call.body!.document })]);
    editLoad(t.store, 10);
    editLoad(t.store, 11);
    expect(t.store.getState().save.kind).toBe("pending");
    expect(readDraft(t.storage, "12")?.baseRevision).toBe(3);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS + 10);
    expect(t.calls).toHaveLength(1);
    expect(t.calls[0]).toMatchObject({ method: "PUT", url: "/api/networks/12" });
    expect(t.calls[0].body!.revision).toBe(3);
    expect(t.calls[0].body!.document.loads[0].pMW).toBe(11);
    expect(t.store.getState().save.kind).toBe("saved");
    expect(t.store.getState().savedRevision).toBe(4);
    expect(readDraft(t.storage, "12")).toBeUndefined();
    t.saver.stop();
  });

  it("meets a newer revision with a conflict, overwrites nothing, and keeps mine as a new revision on request", async () => {
    const t = setup([
      () => json(409, { error: "Revision 3 is not the current one", currentRevision: 5 }),
      (call) => json(200, { revision: 6, document: call.body!.document }),
    ]);
    editLoad(t.store, 12);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS + 10);
    expect(t.store.getState().save).toMatchObject({ kind: "conflict", currentRevision: 5 });
    // further edits do not save while the planner decides
    editLoad(t.store, 13);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS * 3);
    expect(t.calls).toHaveLength(1);
    expect(readDraft(t.storage, "12")?.document.loads[0].pMW).toBe(13);
    t.saver.keepMine();
    await vi.advanceTimersByTimeAsync(10);
    expect(t.calls).toHaveLength(2);
    expect(t.calls[1].body!.revision).toBe(5);
    expect(t.calls[1].body!.document.loads[0].pMW).toBe(13);
    expect(t.store.getState().save.kind).toBe("saved");
    expect(t.store.getState().savedRevision).toBe(6);
    t.saver.stop();
  });

  it("reloads theirs as an undoable edit", async () => {
    const theirs = { ...demo(), name: "Their version" };
    const t = setup([() => json(409, { error: "newer", currentRevision: 5 }), () => json(200, { revision: 5, document: theirs })]);
    editLoad(t.store, 12);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS + 10);
    await t.saver.reloadTheirs();
    expect(t.calls[1].method).toBe("GET");
    expect(t.store.getState().document.name).toBe("Their version");
    expect(t.store.getState().savedRevision).toBe(5);
    expect(t.store.getState().save.kind).toBe("saved");
    t.store.getState().actions.undo();
    expect(t.store.getState().document.loads[0].pMW).toBe(12);
    t.saver.stop();
  });

  it("says offline, keeps the draft, and saves when the browser is back", async () => {
    const t = setup([() => Promise.reject(new TypeError("Failed to fetch")), (call) => json(200, { revision: 4, document: call.body!.document })]);
    editLoad(t.store, 10);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS + 10);
    expect(t.store.getState().save.kind).toBe("offline");
    expect(readDraft(t.storage, "12")).toBeDefined();
    t.goOffline();
    await vi.advanceTimersByTimeAsync(6000);
    expect(t.calls).toHaveLength(1);
    t.goOnline();
    await vi.advanceTimersByTimeAsync(10);
    expect(t.calls).toHaveLength(2);
    expect(t.store.getState().save.kind).toBe("saved");
    t.saver.stop();
  });

  it("saves an unfinished drawing as a draft and says what is left to do", async () => {
    const t = setup([(call) => json(200, { revision: 4, document: call.body!.document, problems: [{ path: "loads[2].bus", message: "not connected" }] })]);
    t.store.getState().actions.place("load", { x: 0, y: 300 });
    await vi.advanceTimersByTimeAsync(AUTOSAVE_DELAY_MS + 10);
    expect(t.calls).toHaveLength(1);
    expect(t.calls[0].body!.document.loads.some((load) => load.bus === "")).toBe(true);
    const save = t.store.getState().save;
    expect(save.kind).toBe("draft");
    if (save.kind === "draft") expect(save.problems[0].message).toMatch(/connect its terminal/);
    expect(readDraft(t.storage, "12")).toBeUndefined();
    t.saver.stop();
  });
});
