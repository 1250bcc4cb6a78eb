// What this browser keeps so that nothing is lost on reload: a draft of unsaved edits, keyed by
// network id and the revision the edits were made on, and the sheet layout of each network
// (offsets of drawn elements, which are not part of the network file).
import type { Network } from "#solver/schema.ts";
import type { SheetLayout } from "./flowModel.ts";

export interface Draft {
  networkId: string;
  /** The saved revision the edits were made on. */
  baseRevision: number;
  document: Network;
  layout: SheetLayout;
  /** When the draft was written, ISO 8601. */
  writtenAt: string;
}

type KeyValueStorage = Pick<Storage, "getItem" | "setItem" | "removeItem" | "key" | "length">;

const draftPrefix = (networkId: string) => `kilostep:draft:${networkId}:`;
const layoutKey = (networkId: string) => `kilostep:layout:${networkId}`;

function keysWithPrefix(storage: KeyValueStorage, prefix: string): string[] {
  const keys: string[] = [];
  for (let i = 0; i < storage.length; i++) {
    const key = storage.key(i);
    if (key?.startsWith(prefix)) keys.push(key);
  }
  return keys;
}

function isDraft(value: unknown, networkId: string): value is Draft {
  if (!value || typeof value !== "object") return false;
  const d = value as Partial<Draft>;
  return (
    d.networkId === networkId &&
    typeof d.baseRevision === "number" &&
    typeof d.writtenAt === "string" &&
    !!d.document &&
    typeof d.document === "object" &&
    Array.isArray((d.document as Network).buses) &&
    !!d.layout &&
    typeof d.layout === "object"
  );
}

/** Storage can be full, disabled or private: a draft that cannot be kept is not worth a crash. */
function safely<T>(run: () => T, fallback: T): T {
  try {
    return run();
  } catch {
    return fallback;
  }
}

export function writeDraft(storage: KeyValueStorage, draft: Draft): void {
  safely(() => {
    for (const key of keysWithPrefix(storage, draftPrefix(draft.networkId)))
      if (key !== draftPrefix(draft.networkId) + draft.baseRevision) storage.removeItem(key);
    storage.setItem(draftPrefix(draft.networkId) + draft.baseRevision, JSON.stringify(draft));
  }, undefined);
}

export function clearDrafts(storage: KeyValueStorage, networkId: string): void {
  safely(() => keysWithPrefix(storage, draftPrefix(networkId)).forEach((key) => storage.removeItem(key)), undefined);
}

/** The newest draft of a network, if one was left behind. */
export function readDraft(storage: KeyValueStorage, networkId: string): Draft | undefined {
  return safely(() => {
    let newest: Draft | undefined;
    for (const key of keysWithPrefix(storage, draftPrefix(networkId))) {
      const value: unknown = JSON.parse(storage.getItem(key) ?? "null");
      if (isDraft(value, networkId) && (!newest || value.writtenAt > newest.writtenAt)) newest = value;
    }
    return newest;
  }, undefined);
}

/**
 * A draft is offered back when it holds something the saved revision does not. One made on an
 * older revision is offered too (someone saved since): restoring it saves it as a new revision,
 * so neither version is lost.
 */
export function draftToOffer(draft: Draft | undefined, saved: { revision: number; document: Network }): Draft | undefined {
  if (!draft) return undefined;
  if (draft.baseRevision > saved.revision) return draft;
  return JSON.stringify(draft.document) === JSON.stringify(saved.document) ? undefined : draft;
}

export function readLayout(storage: KeyValueStorage, networkId: string): SheetLayout | undefined {
  return safely(() => {
    const value: unknown = JSON.parse(storage.getItem(layoutKey(networkId)) ?? "null");
    if (!value || typeof value !== "object" || Array.isArray(value)) return undefined;
    const layout: SheetLayout = {};
    for (const [id, offset] of Object.entries(value as Record<string, unknown>)) {
      const o = offset as { x?: unknown; y?: unknown };
      if (o && Number.isFinite(o.x) && Number.isFinite(o.y)) layout[id] = { x: o.x as number, y: o.y as number };
    }
    return layout;
  }, undefined);
}

export function writeLayout(storage: KeyValueStorage, networkId: string, layout: SheetLayout): void {
  safely(() => storage.setItem(layoutKey(networkId), JSON.stringify(layout)), undefined);
}
