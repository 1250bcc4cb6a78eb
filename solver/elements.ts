// The element vocabulary of the network file, defined once: the kinds of element, the collection
// each lives in, and how a person names each kind. The solver's checks, the app's sheet, report,
// review notes, revision differences and imports all walk the document through these.
import type { Bus, Line, Load, Network, Shunt, Source, Transformer } from "#solver/schema.ts";

export const ELEMENT_KINDS = ["bus", "source", "transformer", "line", "load", "shunt"] as const;
export type ElementKind = (typeof ELEMENT_KINDS)[number];

export const COLLECTION_OF_KIND = {
  bus: "buses",
  source: "sources",
  transformer: "transformers",
  line: "lines",
  load: "loads",
  shunt: "shunts",
} as const satisfies Record<ElementKind, keyof Network>;
export type ElementCollection = (typeof COLLECTION_OF_KIND)[ElementKind];

/** The document's element collections in file order. */
export const ELEMENT_COLLECTIONS: readonly ElementCollection[] = ELEMENT_KINDS.map((kind) => COLLECTION_OF_KIND[kind]);

export const KIND_OF_COLLECTION = Object.fromEntries(ELEMENT_KINDS.map((kind) => [COLLECTION_OF_KIND[kind], kind])) as Record<
  ElementCollection,
  ElementKind
>;

/** How a sentence names a kind of element: "Bus", "Transformer", …. */
export const KIND_LABEL: Record<ElementKind, string> = {
  bus: "Bus",
  source: "Source",
  transformer: "Transformer",
  line: "Line",
  load: "Load",
  shunt: "Shunt",
};

export type AnyElement = Bus | Source | Transformer | Line | Load | Shunt;

export interface ElementEntry {
  kind: ElementKind;
  element: AnyElement;
  /** Position in its collection of the document. */
  index: number;
}

/** Every element by id, collections in file order; should an id repeat, its first element wins. */
export function indexElements(doc: Pick<Network, ElementCollection>): Map<string, ElementEntry> {
  const entries = new Map<string, ElementEntry>();
  for (const kind of ELEMENT_KINDS) {
    const list = (doc[COLLECTION_OF_KIND[kind]] ?? []) as AnyElement[];
    for (let index = 0; index < list.length; index++) {
      const element = list[index];
      if (!entries.has(element.id)) entries.set(element.id, { kind, element, index });
    }
  }
  return entries;
}

/** The words a planner uses for what an element is: "Grid infeed", "Cable", "Busbar". */
export function kindWord(entry: Pick<ElementEntry, "kind" | "element">): string {
  if (entry.kind === "source") return (entry.element as Source).kind === "grid" ? "Grid infeed" : "Generator";
  if (entry.kind === "line") return (entry.element as Line).kind === "cable" ? "Cable" : "Overhead line";
  if (entry.kind === "shunt") return (entry.element as Shunt).qMvar >= 0 ? "Shunt capacitor" : "Shunt reactor";
  if (entry.kind === "bus") return "Busbar";
  return KIND_LABEL[entry.kind];
}

/** `Cable "Tarn Head feeder"`: how a sentence names one element, never by its id. */
export function describeElement(entry: Pick<ElementEntry, "kind" | "element">): string {
  return `${kindWord(entry)} "${entry.element.name}"`;
}
