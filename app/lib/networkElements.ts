// The app's side of the element vocabulary (defined once in #solver/elements.ts): what a review
// note can be pinned to, what a revision difference walks through, what the sheet draws. Pure,
// for the browser and the server alike.
import type { Network } from "#solver/schema.ts";
import { indexElements, type ElementCollection, type ElementEntry } from "#solver/elements.ts";

export {
  COLLECTION_OF_KIND,
  describeElement,
  ELEMENT_COLLECTIONS,
  ELEMENT_KINDS,
  indexElements,
  KIND_LABEL,
  KIND_OF_COLLECTION,
  kindWord,
  type AnyElement,
  type ElementCollection,
  type ElementEntry,
  type ElementKind,
} from "#solver/elements.ts";

/** Every element of the document, collections in file order. */
export function elementsOf(network: Pick<Network, ElementCollection>): ElementEntry[] {
  return [...indexElements(network).values()];
}

export function findElement(network: Pick<Network, ElementCollection>, id: string): ElementEntry | undefined {
  return indexElements(network).get(id);
}
