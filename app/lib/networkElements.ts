// The elements of a network document as one list: what a review note can be pinned to and what a
// revision difference walks through. Pure, for the browser and the server alike.
import type { Network } from "#solver/schema.ts";

export const ELEMENT_COLLECTIONS = ["buses", "sources", "transformers", "lines", "loads", "shunts"] as const;
export type ElementCollection = (typeof ELEMENT_COLLECTIONS)[number];

export const KIND_OF_COLLECTION: Record<ElementCollection, string> = {
  buses: "Bus",
  sources: "Source",
  transformers: "Transformer",
  lines: "Line",
  loads: "Load",
  shunts: "Shunt",
};

export interface ElementEntry {
  id: string;
  name: string;
  collection: ElementCollection;
  /** "Bus", "Line", …: how a person names what it is. */
  kind: string;
}

export function elementsOf(network: Pick<Network, ElementCollection>): ElementEntry[] {
  return ELEMENT_COLLECTIONS.flatMap((collection) =>
    (network[collection] ?? []).map((element) => ({ id: element.id, name: element.name, collection, kind: KIND_OF_COLLECTION[collection] })),
  );
}

export function findElement(network: Pick<Network, ElementCollection>, id: string): ElementEntry | undefined {
  return elementsOf(network).find((e) => e.id === id);
}

/** "Line "Tarn Head 66 kV" (l1)" — for sentences in mail and the audit log. */
export function elementLabel(entry: Pick<ElementEntry, "kind" | "name" | "id">): string {
  return `${entry.kind.toLowerCase()} "${entry.name}" (${entry.id})`;
}
