// The complete part of a draft: what can be solved while the rest is still being drawn. Every
// element a problem names is left out; a busbar left out takes what hangs on it; what is left is
// checked again until it is a complete network (or nothing is left). The planner sees readings
// on the complete part and the left-out elements marked, instead of a sheet with no numbers.
import { validateNetwork, type Network } from "#solver/schema.ts";
import { documentIssues } from "./documentIssues.ts";
import { COLLECTION_OF_KIND, indexElements, type AnyElement, type ElementKind } from "#app/lib/networkElements.ts";
import { terminalBus, terminalsOf } from "./flowModel.ts";

/** Each pass leaves out at least one element; a few passes settle any drawing. */
const MAX_PASSES = 8;

export interface SolvablePart {
  network: Network;
  /** Ids of the elements (busbars included) that are not part of `network`. */
  leftOut: Set<string>;
}

function without(doc: Network, leftOut: Set<string>): Network {
  const next = { ...doc, cases: undefined, growth: undefined } as Network;
  for (const kind of Object.keys(COLLECTION_OF_KIND) as ElementKind[]) {
    const key = COLLECTION_OF_KIND[kind];
    (next as unknown as Record<string, AnyElement[]>)[key] = (doc[key] as AnyElement[]).filter((element) => !leftOut.has(element.id));
  }
  return next;
}

/** Undefined when nothing of the drawing can be solved yet. */
export function solvablePart(doc: Network): SolvablePart | undefined {
  const leftOut = new Set<string>();
  let part = doc;
  for (let pass = 0; pass < MAX_PASSES; pass++) {
    if (validateNetwork(part).ok) return part.buses.length ? { network: part, leftOut } : undefined;
    const named = documentIssues(part).flatMap((issue) => (issue.elementId ? [issue.elementId] : []));
    if (named.length === 0) return undefined;
    const entries = indexElements(part);
    for (const id of named) leftOut.add(id);
    // Whatever hangs on a busbar that is left out goes with it.
    for (const [id, entry] of entries) {
      if (entry.kind === "bus") continue;
      if (terminalsOf(entry.kind).some((terminal) => leftOut.has(terminalBus(entry, terminal)))) leftOut.add(id);
    }
    part = without(doc, leftOut);
    if (part.buses.length === 0) return undefined;
  }
  return undefined;
}
