// Edits a planner makes on the sheet, as pure functions from one sheet content to the next:
// place a part, connect or disconnect a terminal, delete, copy and paste.
import { withoutCaseReferences } from "#app/lib/operatingCases.ts";
import { WINDING_TOLERANCE, type Bus, type Network, type Source, type Transformer } from "#solver/schema.ts";
import { anchorOf, busCenterMap, keepDrawnPositions, parseWireId, setTerminalBus, sheetGeometry, terminalBus, terminalField, terminalsOf, type SheetContent, type TerminalId, type XY } from "./flowModel.ts";
import { COLLECTION_OF_KIND, indexElements, type AnyElement, type ElementEntry, type ElementKind } from "#app/lib/networkElements.ts";

export type PartKind = "busbar" | "grid" | "generator" | "transformer" | "overhead" | "cable" | "load" | "capacitor";

export const partKinds: PartKind[] = ["busbar", "grid", "generator", "transformer", "overhead", "cable", "load", "capacitor"];

export const partNames: Record<PartKind, string> = {
  busbar: "Busbar",
  grid: "Grid infeed",
  generator: "Generator",
  transformer: "Transformer",
  overhead: "Overhead line",
  cable: "Cable",
  load: "Load",
  capacitor: "Shunt capacitor",
};

const idPrefix: Record<PartKind, string> = {
  busbar: "bus",
  grid: "grid",
  generator: "gen",
  transformer: "tx",
  overhead: "line",
  cable: "cable",
  load: "load",
  capacitor: "cap",
};

export function elementKindOfPart(part: PartKind): ElementKind {
  switch (part) {
    case "busbar":
      return "bus";
    case "grid":
    case "generator":
      return "source";
    case "overhead":
    case "cable":
      return "line";
    case "capacitor":
      return "shunt";
    default:
      return part;
  }
}

function allIds(doc: Network): Set<string> {
  return new Set(indexElements(doc).keys());
}

function freshId(taken: Set<string>, base: string, first = 1): string {
  for (let n = first; ; n++) {
    const id = `${base}-${n}`;
    if (!taken.has(id)) {
      taken.add(id);
      return id;
    }
  }
}

function freshName(doc: Network, kind: ElementKind, base: string): string {
  const names = new Set((doc[COLLECTION_OF_KIND[kind]] as AnyElement[]).map((e) => e.name));
  for (let n = 1; ; n++) if (!names.has(`${base} ${n}`)) return `${base} ${n}`;
}

/**
 * Values a newly placed part starts with: typical, so that a chain drawn from the shelf solves
 * at once; the planner then types the real ones into Details.
 */
export function newPartElement(doc: Network, part: PartKind, id: string): AnyElement {
  const name = freshName(doc, elementKindOfPart(part), partNames[part]);
  const hasSlack = doc.sources.some((s) => s.control === "slack");
  switch (part) {
    case "busbar":
      return { id, name, nominalKV: 11, vMinPu: 0.95, vMaxPu: 1.05 } satisfies Bus;
    case "grid":
      return {
        id, name, bus: "", kind: "grid", control: "slack", voltagePu: 1, angleDeg: 0, pMW: 0, qMvar: 0,
        shortCircuitMVA: 1000, xOverR: 10,
      } satisfies Source;
    case "generator":
      return {
        id, name, bus: "", kind: "generator", control: hasSlack ? "pv" : "slack", voltagePu: 1, angleDeg: 0,
        pMW: 10, qMvar: 0, ratedMVA: 12.5, ratedKV: 11, xdSubtransientPct: 18, xOverR: 40, ratedPowerFactor: 0.8,
      } satisfies Source;
    case "transformer":
      // 10 MVA: IEC 60076-5 minimum u_k 8 %; X/R 12 is typical for this size (common practice).
      return {
        id, name, hvBus: "", lvBus: "", ratedMVA: 10, hvKV: 33, lvKV: 11, impedancePct: 8, xOverR: 12,
        tapPct: 0, vectorGroup: "Dyn11",
      } satisfies Transformer;
    case "overhead":
      return {
        id, name, fromBus: "", toBus: "", kind: "overhead", lengthKm: 5, rOhmPerKm: 0.2, xOhmPerKm: 0.38,
        bMicroSiemensPerKm: 3, ampacityA: 400,
      };
    case "cable":
      return {
        id, name, fromBus: "", toBus: "", kind: "cable", lengthKm: 2, rOhmPerKm: 0.16, xOhmPerKm: 0.11,
        bMicroSiemensPerKm: 75, ampacityA: 420,
      };
    case "load":
      return { id, name, bus: "", pMW: 2, qMvar: 0.66, model: "constant-power" };
    case "capacitor":
      return { id, name, bus: "", qMvar: 2 };
  }
}

function insert(doc: Network, kind: ElementKind, element: AnyElement): Network {
  const key = COLLECTION_OF_KIND[kind];
  return { ...doc, [key]: [...(doc[key] as AnyElement[]), element] } as Network;
}

export interface EditResult extends SheetContent {
  /** A sentence telling the planner what the sheet did on their behalf, if anything. */
  notice?: string;
}

/**
 * Place a part at a sheet position. A source, load or capacitor dropped onto a busbar is
 * connected to it at once.
 */
export function placePart(content: SheetContent, part: PartKind, at: XY, dropOnBus?: string): EditResult & { id: string } {
  const doc = content.document;
  const id = freshId(allIds(doc), idPrefix[part]);
  const kind = elementKindOfPart(part);
  let element = newPartElement(doc, part, id);
  if (kind === "bus") {
    const bus = { ...(element as Bus), x: at.x, y: at.y };
    return { document: insert(doc, kind, bus), layout: content.layout, id };
  }
  const bus = dropOnBus ? doc.buses.find((b) => b.id === dropOnBus) : undefined;
  if (bus && terminalsOf(kind).length === 1) {
    const adjusted = adjustToBus({ kind, element, index: 0 }, "t", bus);
    element = { ...adjusted.element, bus: bus.id } as AnyElement;
    const side = kind === "source" ? -120 : 120;
    const layout = { ...content.layout, [id]: { x: side, y: at.y - (bus.y ?? 0) } };
    return { document: insert(doc, kind, element), layout, id, notice: adjusted.notice };
  }
  return { document: insert(doc, kind, element), layout: { ...content.layout, [id]: at }, id };
}

/**
 * A transformer winding or generator rating far from the bus it is connected to would only
 * produce a validation error; the sheet adopts the bus voltage instead and says so.
 */
function adjustToBus(entry: ElementEntry, terminal: TerminalId, bus: Bus): { element: AnyElement; notice?: string } {
  const off = (kv: number | undefined) => kv !== undefined && Math.abs(kv / bus.nominalKV - 1) > WINDING_TOLERANCE;
  if (entry.kind === "transformer" && (terminal === "hv" || terminal === "lv")) {
    const t = entry.element as Transformer;
    const key = terminal === "hv" ? "hvKV" : "lvKV";
    if (off(t[key]))
      return {
        element: { ...t, [key]: bus.nominalKV },
        notice: `${terminal.toUpperCase()} winding of ${t.name} set to ${bus.nominalKV} kV to match busbar ${bus.name}.`,
      };
  }
  if (entry.kind === "source") {
    const s = entry.element as Source;
    if (s.kind === "generator" && off(s.ratedKV))
      return {
        element: { ...s, ratedKV: bus.nominalKV },
        notice: `Rated voltage of ${s.name} set to ${bus.nominalKV} kV to match busbar ${bus.name}.`,
      };
  }
  return { element: entry.element };
}

/** Wire a terminal to a busbar (replacing any wire it had), keeping the element where it is drawn. */
export function connectTerminal(content: SheetContent, elementId: string, terminal: TerminalId, busId: string): EditResult {
  const entries = indexElements(content.document);
  const entry = entries.get(elementId);
  const busEntry = entries.get(busId);
  if (!entry || entry.kind === "bus" || !terminalsOf(entry.kind).includes(terminal) || busEntry?.kind !== "bus")
    return content;
  if (terminalBus(entry, terminal) === busId) return content;
  const before = sheetGeometry(content.document, content.layout);
  const adjusted = adjustToBus(entry, terminal, busEntry.element as Bus);
  const document = setTerminalBus(content.document, { ...entry, element: adjusted.element }, terminal, busId);
  const layout = keepDrawnPositions(before, { document, layout: content.layout }, [elementId]);
  return { document, layout, notice: adjusted.notice };
}

/** Delete elements and wires (by wire id); wires to a deleted busbar come loose, nothing else goes. */
export function deleteItems(content: SheetContent, ids: Iterable<string>): SheetContent {
  const entries = indexElements(content.document);
  const doomed = new Set<string>();
  const cut: { elementId: string; terminal: TerminalId }[] = [];
  for (const id of ids) {
    if (entries.has(id)) doomed.add(id);
    else {
      const wire = parseWireId(id);
      if (wire && entries.has(wire.elementId)) cut.push(wire);
    }
  }
  if (doomed.size === 0 && cut.length === 0) return content;
  const before = sheetGeometry(content.document, content.layout);
  for (const [id, entry] of entries) {
    if (doomed.has(id) || entry.kind === "bus") continue;
    for (const terminal of terminalsOf(entry.kind)) if (doomed.has(terminalBus(entry, terminal))) cut.push({ elementId: id, terminal });
  }
  let document = content.document;
  const loosened = new Set<string>();
  for (const { elementId, terminal } of cut) {
    if (doomed.has(elementId)) continue;
    const entry = indexElements(document).get(elementId)!;
    document = setTerminalBus(document, entry, terminal, "");
    loosened.add(elementId);
  }
  const removed = { ...document };
  for (const kind of Object.keys(COLLECTION_OF_KIND) as ElementKind[]) {
    const key = COLLECTION_OF_KIND[kind];
    const list = document[key] as AnyElement[];
    if (list.some((e) => doomed.has(e.id))) (removed as Record<string, unknown>)[key] = list.filter((e) => !doomed.has(e.id));
  }
  document = withoutCaseReferences(removed, doomed);
  let layout = keepDrawnPositions(before, { document, layout: content.layout }, loosened);
  if ([...doomed].some((id) => id in layout)) {
    layout = { ...layout };
    for (const id of doomed) delete layout[id];
  }
  return { document, layout };
}

export interface Clipboard {
  items: { kind: ElementKind; element: AnyElement; center: XY }[];
}

export function copyItems(content: SheetContent, ids: Iterable<string>): Clipboard | undefined {
  const geometry = sheetGeometry(content.document, content.layout);
  const items: Clipboard["items"] = [];
  for (const id of new Set(ids)) {
    const entry = geometry.entries.get(id);
    if (entry) items.push({ kind: entry.kind, element: entry.element, center: geometry.centers.get(id)! });
  }
  return items.length ? { items } : undefined;
}

/**
 * Paste copies with fresh ids. References among the copied elements follow the copies (a copied
 * bus with its load gives a new bus with a new load on it); references to a bus that was not
 * copied come loose, so a paste never silently joins new elements to the existing network.
 */
export function pasteClipboard(content: SheetContent, clipboard: Clipboard, shift: XY): SheetContent & { ids: string[] } {
  const taken = allIds(content.document);
  const newId = new Map<string, string>();
  for (const item of clipboard.items) newId.set(item.element.id, freshId(taken, item.element.id.replace(/-\d+$/, ""), 2));
  let document = content.document;
  const centers = new Map<string, XY>();
  for (const item of clipboard.items) {
    const id = newId.get(item.element.id)!;
    const center = { x: item.center.x + shift.x, y: item.center.y + shift.y };
    centers.set(id, center);
    const copy: Record<string, unknown> = { ...item.element, id, name: `${item.element.name} copy`.slice(0, 200) };
    if (item.kind === "bus") Object.assign(copy, center);
    for (const terminal of terminalsOf(item.kind)) {
      const field = terminalField[terminal];
      copy[field] = newId.get(copy[field] as string) ?? "";
    }
    document = insert(document, item.kind, copy as unknown as AnyElement);
  }
  const entries = indexElements(document);
  const busCenters = busCenterMap(document);
  const layout = { ...content.layout };
  for (const [id, center] of centers) {
    const entry = entries.get(id)!;
    if (entry.kind === "bus") continue;
    const anchor = anchorOf(entry, busCenters);
    layout[id] = { x: center.x - anchor.x, y: center.y - anchor.y };
  }
  return { document, layout, ids: [...newId.values()] };
}
