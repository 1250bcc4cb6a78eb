import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { clearDrafts, draftToOffer, readDraft, readLayout, writeDraft, writeLayout, type Draft } from "#app/components/sheet/draftStorage.ts";

function demo(): Network {
  const parsed = validateNetwork(JSON.parse(readFileSync("tests/fixtures/tarn-head-calder-flats.json", "utf8")));
  if (!parsed.ok) throw new Error("demo network does not validate");
  return parsed.network;
}

class MemoryStorage {
  private items = new Map<string, string>();
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

const edited = (doc: Network): Network => ({ ...doc, loads: doc.loads.map((l) => ({ ...l, pMW: l.pMW + 1 })) });

describe("drafts in this browser", () => {
  it("keeps one draft per network, keyed by id and base revision, and reads it back", () => {
    const storage = new MemoryStorage();
    const doc = edited(demo());
    writeDraft(storage, { networkId: "4", baseRevision: 2, document: doc, layout: {}, writtenAt: "2030-01-01T10:00:00Z" });
    writeDraft(storage, { networkId: "4", baseRevision: 3, document: doc, layout: { x: { x: 1, y: 2 } }, writtenAt: "2030-01-01T10:05:00Z" });
    writeDraft(storage, { networkId: "5", baseRevision: 1, document: doc, layout: {}, writtenAt: "2030-01-01T10:06:00Z" });
    expect(storage.length).toBe(2);
    expect(storage.getItem("kilostep:draft:4:3")).not.toBeNull();
    const draft = readDraft(storage, "4")!;
    expect(draft.baseRevision).toBe(3);
    expect(draft.layout).toEqual({ x: { x: 1, y: 2 } });
    clearDrafts(storage, "4");
    expect(readDraft(storage, "4")).toBeUndefined();
    expect(readDraft(storage, "5")).toBeDefined();
  });

  it("ignores what is not a draft and survives a broken storage", () => {
    const storage = new MemoryStorage();
    storage.setItem("kilostep:draft:4:1", "{not json");
    storage.setItem("kilostep:draft:4:2", JSON.stringify({ networkId: "4" }));
    expect(readDraft(storage, "4")).toBeUndefined();
    const broken = { length: 0, key: () => null, getItem: () => { throw new Error("denied"); }, setItem: () => { throw new Error("full"); }, removeItem: () => undefined };
    expect(readDraft(broken, "4")).toBeUndefined();
    expect(() => writeDraft(broken, { networkId: "4", baseRevision: 1, document: demo(), layout: {}, writtenAt: "" })).not.toThrow();
  });

  it("offers a draft back only when it holds something the saved revision does not", () => {
    const saved = { revision: 3, document: demo() };
    const draft = (baseRevision: number, document: Network): Draft => ({ networkId: "4", baseRevision, document, layout: {}, writtenAt: "2030-01-01T10:00:00Z" });
    expect(draftToOffer(undefined, saved)).toBeUndefined();
    expect(draftToOffer(draft(3, demo()), saved)).toBeUndefined();
    expect(draftToOffer(draft(3, edited(demo())), saved)).toBeDefined();
    // made on revision 2, revision 3 saved since: still offered, nothing is lost
    expect(draftToOffer(draft(2, edited(demo())), saved)).toBeDefined();
  });

  it("keeps the sheet layout per network and drops malformed offsets", () => {
    const storage = new MemoryStorage();
    writeLayout(storage, "4", { "ld-town": { x: 140, y: 40 } });
    expect(readLayout(storage, "4")).toEqual({ "ld-town": { x: 140, y: 40 } });
    storage.setItem("kilostep:layout:5", JSON.stringify({ a: { x: 1, y: "2" }, b: { x: 3, y: 4 } }));
    expect(readLayout(storage, "5")).toEqual({ b: { x: 3, y: 4 } });
    expect(readLayout(storage, "6")).toBeUndefined();
  });
});
