// The sheet drawn from the network document: pure functions, no React state.
//
// Modelling: every bus is a vertical busbar node; every other element (source, transformer,
// line, load, shunt) is a node with one or two terminals, and each bus reference of the document
// is a wire edge from a terminal to a busbar. Connecting, moving and deleting wires is therefore
// editing the references of the document, which stays the one source of truth.
//
// Positions: the network file keeps x, y on buses only, so buses are placed from the document.
// Every other element is placed relative to an anchor derived from its buses (its bus for a
// source, load or shunt; the midpoint of its two buses for a transformer or line), plus an offset
// kept in the sheet layout. The layout is not part of the network file: it lives in the editor's
// store (undone with the document) and in this browser's storage per network. Without a stored
// offset the element takes a default place beside its bus, so a document opened anywhere, or
// imported from a file, is drawn sensibly, and moving a bus carries its elements with it.
import { Position, type Edge, type Node } from "@xyflow/react";
import type { Bus, Network } from "#solver/schema.ts";
import {
  COLLECTION_OF_KIND,
  describeElement,
  indexElements,
  type AnyElement,
  type ElementEntry,
  type ElementKind,
} from "#app/lib/networkElements.ts";

export type TerminalId = "t" | "hv" | "lv" | "from" | "to";
export type Side = "left" | "right";
export interface XY {
  x: number;
  y: number;
}
/** Offsets of non-bus elements from their anchor, by element id. */
export type SheetLayout = Record<string, XY>;

export const GRID_PX = 20;
/** Default spacing of buses without a position in the document. */
const BUS_SPACING_PX = 240;
export const BAR_HIT_WIDTH_PX = 24;
export const BAR_HALF_THICKNESS_PX = 3;
const MIN_BAR_HALF_LENGTH_PX = 40;
const ATTACHMENT_SLOT_PX = 120;
const ATTACHMENT_OFFSET_PX = 120;
const TERMINAL_HANDLE_PX = 12;
const DETOUR_PX = 14;

export const terminalField = {
  t: "bus",
  hv: "hvBus",
  lv: "lvBus",
  from: "fromBus",
  to: "toBus",
} as const satisfies Record<TerminalId, string>;

const twoTerminals = { transformer: ["hv", "lv"], line: ["from", "to"] } as const;

export function terminalsOf(kind: ElementKind): TerminalId[] {
  if (kind === "bus") return [];
  if (kind === "transformer" || kind === "line") return [...twoTerminals[kind]];
  return ["t"];
}

/** The bus id a terminal refers to; "" when it is not connected. */
export function terminalBus(entry: ElementEntry, terminal: TerminalId): string {
  const value = (entry.element as unknown as Record<string, unknown>)[terminalField[terminal]];
  return typeof value === "string" ? value : "";
}

export function wireId(elementId: string, terminal: TerminalId): string {
  return `${elementId}~${terminal}`;
}

export function parseWireId(id: string): { elementId: string; terminal: TerminalId } | undefined {
  const at = id.lastIndexOf("~");
  if (at < 0) return undefined;
  const terminal = id.slice(at + 1);
  if (!(terminal in terminalField)) return undefined;
  return { elementId: id.slice(0, at), terminal: terminal as TerminalId };
}

const partSizes: Record<Exclude<ElementKind, "bus">, { width: number; height: number }> = {
  source: { width: 64, height: 44 },
  transformer: { width: 84, height: 44 },
  line: { width: 100, height: 28 },
  load: { width: 60, height: 32 },
  shunt: { width: 60, height: 40 },
};

export function partSize(kind: Exclude<ElementKind, "bus">): { width: number; height: number } {
  return partSizes[kind];
}

export function busDefaultCenter(bus: Bus, index: number): XY {
  return { x: bus.x ?? index * BUS_SPACING_PX, y: bus.y ?? 0 };
}

/** Where an element's offset is measured from: its bus, the midpoint of its buses, or the origin. */
export function anchorOf(entry: ElementEntry, busCenters: Map<string, XY>): XY {
  const connected = terminalsOf(entry.kind)
    .map((t) => busCenters.get(terminalBus(entry, t)))
    .filter((c): c is XY => c !== undefined);
  if (connected.length === 0) return { x: 0, y: 0 };
  return {
    x: connected.reduce((sum, c) => sum + c.x, 0) / connected.length,
    y: connected.reduce((sum, c) => sum + c.y, 0) / connected.length,
  };
}

/**
 * Default places beside a busbar: a source on its left, a load or shunt on its right, level with
 * the bar's centre when that spot is free. A spot is taken when a branch leaves the bar there or
 * another element hangs within one slot of it; then the element tries the other side, then a
 * slot further down, then up, and so on. Elements the planner has placed keep their place, so placing
 * one never shifts the others.
 */
function defaultOffsets(entries: Map<string, ElementEntry>, busCenters: Map<string, XY>, layout: SheetLayout): Map<string, XY> {
  const offsets = new Map<string, XY>();
  const taken = new Map<string, Record<Side, number[]>>();
  const occupy = (busId: string, side: Side, y: number) => {
    const sides = taken.get(busId) ?? { left: [], right: [] };
    sides[side].push(y);
    taken.set(busId, sides);
  };
  const isFree = (busId: string, side: Side, y: number) =>
    (taken.get(busId)?.[side] ?? []).every((other) => Math.abs(other - y) >= ATTACHMENT_SLOT_PX);

  const waiting: { id: string; entry: ElementEntry; busId: string }[] = [];
  const parallels = new Map<string, number>();
  for (const [id, entry] of entries) {
    if (entry.kind === "bus") continue;
    const buses = terminalsOf(entry.kind)
      .map((t) => terminalBus(entry, t))
      .filter((b) => busCenters.has(b));
    if (buses.length === 0) continue;
    if ((entry.kind === "transformer" || entry.kind === "line") && buses.length === 1 && !layout[id]) {
      const [a] = terminalsOf(entry.kind);
      offsets.set(id, { x: terminalBus(entry, a) === buses[0] ? ATTACHMENT_OFFSET_PX : -ATTACHMENT_OFFSET_PX, y: 0 });
    }
    // Parallel branches (the same two buses) fan out below and above the first instead of
    // being drawn on top of it.
    if (buses.length === 2 && buses[0] !== buses[1] && !layout[id]) {
      const pair = buses[0] < buses[1] ? `${buses[0]}\n${buses[1]}` : `${buses[1]}\n${buses[0]}`;
      const before = parallels.get(pair) ?? 0;
      parallels.set(pair, before + 1);
      if (before > 0) offsets.set(id, { x: 0, y: (before % 2 === 1 ? 1 : -1) * Math.ceil(before / 2) * ATTACHMENT_SLOT_PX });
    }
    const single = entry.kind === "source" || entry.kind === "load" || entry.kind === "shunt";
    if (single && !layout[id]) {
      waiting.push({ id, entry, busId: buses[0] });
      continue;
    }
    const anchor = anchorOf(entry, busCenters);
    const offset = layout[id] ?? offsets.get(id) ?? { x: 0, y: 0 };
    const center = { x: anchor.x + offset.x, y: anchor.y + offset.y };
    for (const busId of buses) occupy(busId, center.x < busCenters.get(busId)!.x ? "left" : "right", center.y);
  }

  // A bar whose slots are all taken stays full: later elements skip the search (a bus with
  // thousands of loads would otherwise search every slot for each of them).
  const full = new Set<string>();
  nextElement: for (const { id, entry, busId } of waiting) {
    if (full.has(busId)) continue;
    const bar = busCenters.get(busId)!;
    const preferred: Side = entry.kind === "source" ? "left" : "right";
    const other: Side = preferred === "left" ? "right" : "left";
    for (let k = 0; k < 64; k++) {
      const dy = k === 0 ? 0 : (k % 2 === 1 ? 1 : -1) * Math.ceil(k / 2) * ATTACHMENT_SLOT_PX;
      for (const side of [preferred, other]) {
        if (!isFree(busId, side, bar.y + dy)) continue;
        offsets.set(id, { x: side === "left" ? -ATTACHMENT_OFFSET_PX : ATTACHMENT_OFFSET_PX, y: dy });
        occupy(busId, side, bar.y + dy);
        continue nextElement;
      }
    }
    full.add(busId);
  }
  return offsets;
}

export interface Wire {
  id: string;
  elementId: string;
  terminal: TerminalId;
  busId: string;
  points: XY[];
  nominalKV: number;
}

export interface BarExtent {
  top: number;
  bottom: number;
}

export interface SheetGeometry {
  entries: Map<string, ElementEntry>;
  busCenters: Map<string, XY>;
  centers: Map<string, XY>;
  sides: Map<string, Partial<Record<TerminalId, Side>>>;
  /** Each busbar's drawn extent above (top, negative) and below (bottom) its centre. */
  busExtents: Map<string, BarExtent>;
  wires: Wire[];
}

function sideTowards(from: XY, to: XY | undefined, fallback: Side): Side {
  if (!to || to.x === from.x) return fallback;
  return to.x < from.x ? "left" : "right";
}

function terminalSides(entry: ElementEntry, center: XY, busCenters: Map<string, XY>): Partial<Record<TerminalId, Side>> {
  if (entry.kind === "bus") return {};
  if (entry.kind === "transformer" || entry.kind === "line") {
    const [a, b] = terminalsOf(entry.kind);
    const aBus = busCenters.get(terminalBus(entry, a));
    const bBus = busCenters.get(terminalBus(entry, b));
    let aSide: Side = "left";
    if (aBus && bBus) aSide = aBus.x === bBus.x ? sideTowards(center, aBus, "left") : aBus.x < bBus.x ? "left" : "right";
    else if (aBus) aSide = sideTowards(center, aBus, "left");
    else if (bBus) aSide = sideTowards(center, bBus, "right") === "left" ? "right" : "left";
    return { [a]: aSide, [b]: aSide === "left" ? "right" : "left" };
  }
  const fallback: Side = entry.kind === "source" ? "right" : "left";
  return { t: sideTowards(center, busCenters.get(terminalBus(entry, "t")), fallback) };
}

export function terminalPoint(kind: Exclude<ElementKind, "bus">, center: XY, side: Side): XY {
  const { width } = partSizes[kind];
  return { x: center.x + (side === "left" ? -width / 2 : width / 2), y: center.y };
}

/** Lay out the whole sheet: node centers, terminal sides, busbar lengths and wire routes. */
export function sheetGeometry(doc: Network, layout: SheetLayout, overrides?: Record<string, XY>): SheetGeometry {
  const entries = indexElements(doc);
  const busCenters = busCenterMap(doc);
  if (overrides) for (const id of busCenters.keys()) if (overrides[id]) busCenters.set(id, overrides[id]);
  const defaults = defaultOffsets(entries, busCenters, layout);
  const centers = new Map<string, XY>(busCenters);
  const sides = new Map<string, Partial<Record<TerminalId, Side>>>();
  for (const [id, entry] of entries) {
    if (entry.kind === "bus") continue;
    const override = overrides?.[id];
    let center: XY;
    if (override) center = override;
    else {
      const anchor = anchorOf(entry, busCenters);
      const offset = layout[id] ?? defaults.get(id) ?? { x: 0, y: 0 };
      center = { x: anchor.x + offset.x, y: anchor.y + offset.y };
    }
    centers.set(id, center);
    sides.set(id, terminalSides(entry, center, busCenters));
  }

  const wires: Wire[] = [];
  const reach = new Map<string, { up: number; down: number }>();
  for (const [id, entry] of entries) {
    if (entry.kind === "bus") continue;
    for (const terminal of terminalsOf(entry.kind)) {
      const busId = terminalBus(entry, terminal);
      const bar = busCenters.get(busId);
      if (!bar) continue;
      const side = sides.get(id)![terminal]!;
      const start = terminalPoint(entry.kind, centers.get(id)!, side);
      const barX = start.x < bar.x ? bar.x - BAR_HALF_THICKNESS_PX : bar.x + BAR_HALF_THICKNESS_PX;
      const facesBar = side === "left" ? bar.x < start.x : bar.x > start.x;
      let points: XY[];
      if (facesBar) points = [start, { x: barX, y: start.y }];
      else {
        const outX = start.x + (side === "left" ? -DETOUR_PX : DETOUR_PX);
        const detourY = start.y + partSizes[entry.kind].height / 2 + DETOUR_PX;
        const landX = outX < bar.x ? bar.x - BAR_HALF_THICKNESS_PX : bar.x + BAR_HALF_THICKNESS_PX;
        points = [start, { x: outX, y: start.y }, { x: outX, y: detourY }, { x: landX, y: detourY }];
      }
      const landY = points[points.length - 1].y;
      const seen = reach.get(busId) ?? { up: 0, down: 0 };
      reach.set(busId, { up: Math.max(seen.up, bar.y - landY), down: Math.max(seen.down, landY - bar.y) });
      const bus = entries.get(busId)!.element as Bus;
      wires.push({ id: wireId(id, terminal), elementId: id, terminal, busId, points, nominalKV: bus.nominalKV });
    }
  }
  // A bar reaches every wire that lands on it, and always a little past its own centre.
  const busExtents = new Map<string, BarExtent>();
  const margin = (v: number) => Math.max(MIN_BAR_HALF_LENGTH_PX, Math.ceil((v + 16) / GRID_PX) * GRID_PX);
  for (const busId of busCenters.keys()) {
    const seen = reach.get(busId) ?? { up: 0, down: 0 };
    busExtents.set(busId, { top: -margin(seen.up), bottom: margin(seen.down) });
  }
  return { entries, busCenters, centers, sides, busExtents, wires };
}

export interface SheetNodeData extends Record<string, unknown> {
  kind: ElementKind;
  element: AnyElement;
  width: number;
  height: number;
  sides: Partial<Record<TerminalId, Side>>;
  /** Nominal kV of the bus each terminal is wired to; absent when not connected. */
  terminalKV: Partial<Record<TerminalId, number>>;
  /** Busbars only: the drawn bar, relative to the node's centre (the node box is symmetric). */
  bar?: BarExtent;
}

export type SheetNode = Node<SheetNodeData, ElementKind>;

export interface WireData extends Record<string, unknown> {
  points: XY[];
  nominalKV: number;
}

export type WireEdge = Edge<WireData, "wire">;

export interface FlowOptions {
  selection?: ReadonlySet<string>;
  overrides?: Record<string, XY>;
}

/** The xyflow nodes and edges for a document: derived every time, never stored. */
export function documentToFlow(
  doc: Network,
  layout: SheetLayout,
  options: FlowOptions = {},
): { nodes: SheetNode[]; edges: WireEdge[]; geometry: SheetGeometry } {
  const geometry = sheetGeometry(doc, layout, options.overrides);
  const selection = options.selection ?? new Set<string>();
  const nodes: SheetNode[] = [];
  const busKV = (busId: string) => {
    const entry = geometry.entries.get(busId);
    return entry?.kind === "bus" ? (entry.element as Bus).nominalKV : undefined;
  };
  for (const [id, entry] of geometry.entries) {
    const center = geometry.centers.get(id)!;
    let width: number;
    let height: number;
    let handles: NonNullable<SheetNode["handles"]>;
    const terminalKV: Partial<Record<TerminalId, number>> = {};
    const sides = geometry.sides.get(id) ?? {};
    let bar: BarExtent | undefined;
    if (entry.kind === "bus") {
      bar = geometry.busExtents.get(id)!;
      const half = Math.max(-bar.top, bar.bottom);
      width = BAR_HIT_WIDTH_PX;
      height = half * 2;
      handles = [{ id: "bar", type: "target", position: Position.Left, x: 0, y: half + bar.top, width, height: bar.bottom - bar.top }];
    } else {
      ({ width, height } = partSizes[entry.kind]);
      handles = terminalsOf(entry.kind).map((terminal) => {
        const kv = busKV(terminalBus(entry, terminal));
        if (kv !== undefined) terminalKV[terminal] = kv;
        const side = sides[terminal]!;
        return {
          id: terminal,
          type: "source" as const,
          position: side === "left" ? Position.Left : Position.Right,
          x: side === "left" ? -TERMINAL_HANDLE_PX / 2 : width - TERMINAL_HANDLE_PX / 2,
          y: height / 2 - TERMINAL_HANDLE_PX / 2,
          width: TERMINAL_HANDLE_PX,
          height: TERMINAL_HANDLE_PX,
        };
      });
    }
    nodes.push({
      id,
      type: entry.kind,
      position: center,
      width,
      height,
      measured: { width, height },
      handles,
      selected: selection.has(id),
      ariaLabel: describeElement(entry),
      data: { kind: entry.kind, element: entry.element, width, height, sides, terminalKV, bar },
    });
  }
  const edges: WireEdge[] = geometry.wires.map((wire) => ({
    id: wire.id,
    type: "wire",
    source: wire.elementId,
    sourceHandle: wire.terminal,
    target: wire.busId,
    targetHandle: "bar",
    selected: selection.has(wire.id),
    ariaLabel: `Connection of ${describeElement(geometry.entries.get(wire.elementId)!)} to busbar ${geometry.entries.get(wire.busId)!.element.name}`,
    data: { points: wire.points, nominalKV: wire.nominalKV },
  }));
  return { nodes, edges, geometry };
}

/** The busbar whose bar lies under a point (within a tolerance), for dropping a part onto a bus. */
export function busAt(geometry: SheetGeometry, point: XY, tolerancePx = 24): string | undefined {
  let best: { id: string; distance: number } | undefined;
  for (const [id, center] of geometry.busCenters) {
    const { top, bottom } = geometry.busExtents.get(id)!;
    const dx = Math.abs(point.x - center.x);
    const dy = Math.max(0, center.y + top - point.y, point.y - (center.y + bottom));
    const distance = Math.hypot(dx, dy);
    if (distance <= tolerancePx && (!best || distance < best.distance)) best = { id, distance };
  }
  return best?.id;
}

export function busCenterMap(doc: Network): Map<string, XY> {
  const centers = new Map<string, XY>();
  doc.buses.forEach((bus, i) => {
    if (!centers.has(bus.id)) centers.set(bus.id, busDefaultCenter(bus, i));
  });
  return centers;
}

export interface SheetContent {
  document: Network;
  layout: SheetLayout;
}

/**
 * After an edit that changes references, keep the given elements where they were drawn: their
 * offsets are re-measured from their new anchors.
 */
export function keepDrawnPositions(before: SheetGeometry, next: SheetContent, ids: Iterable<string>): SheetLayout {
  const entries = indexElements(next.document);
  const busCenters = busCenterMap(next.document);
  let layout = next.layout;
  for (const id of ids) {
    const entry = entries.get(id);
    const drawn = before.centers.get(id);
    if (!entry || entry.kind === "bus" || !drawn) continue;
    const anchor = anchorOf(entry, busCenters);
    if (layout === next.layout) layout = { ...layout };
    layout[id] = { x: drawn.x - anchor.x, y: drawn.y - anchor.y };
  }
  return layout;
}

/**
 * Commit moved nodes (from a drag or the arrow keys): buses take the new x, y in the document;
 * other elements get new offsets from their anchors, measured after the buses have moved, so a
 * bus dragged together with its load keeps the load's offset.
 */
export function applyMoves(state: SheetContent, moves: Record<string, XY>): SheetContent {
  const round = (v: number) => Math.round(v * 100) / 100;
  let document = state.document;
  if (state.document.buses.some((b) => moves[b.id])) {
    document = {
      ...state.document,
      buses: state.document.buses.map((b) => (moves[b.id] ? { ...b, x: round(moves[b.id].x), y: round(moves[b.id].y) } : b)),
    };
  }
  const entries = indexElements(document);
  const busCenters = busCenterMap(document);
  let layout = state.layout;
  for (const [id, position] of Object.entries(moves)) {
    const entry = entries.get(id);
    if (!entry || entry.kind === "bus") continue;
    const anchor = anchorOf(entry, busCenters);
    if (layout === state.layout) layout = { ...layout };
    layout[id] = { x: round(position.x - anchor.x), y: round(position.y - anchor.y) };
  }
  return { document, layout };
}

/** Replace one element of the document (same id), keeping everything else by reference. */
export function replaceElement(doc: Network, entry: ElementEntry, element: AnyElement): Network {
  const key = COLLECTION_OF_KIND[entry.kind];
  const list = [...(doc[key] as AnyElement[])];
  list[entry.index] = element;
  return { ...doc, [key]: list } as Network;
}

/** Set (or clear, with "") the bus a terminal refers to. */
export function setTerminalBus(doc: Network, entry: ElementEntry, terminal: TerminalId, busId: string): Network {
  return replaceElement(doc, entry, { ...entry.element, [terminalField[terminal]]: busId } as AnyElement);
}

/** Room around a node for its name above and its Readings below. */
const LABEL_ROOM_PX = { x: 24, above: 36, below: 40 };

/**
 * The nearest free place to put a new element of the given size, starting at `at` and stepping
 * out diagonally two grid steps at a time, so repeated placing fans out instead of piling up.
 */
export function freeSpotNear(geometry: SheetGeometry, at: XY, size: { width: number; height: number }): XY {
  const boxes: { l: number; r: number; t: number; b: number }[] = [];
  for (const [id, entry] of geometry.entries) {
    const c = geometry.centers.get(id)!;
    if (entry.kind === "bus") {
      const { top, bottom } = geometry.busExtents.get(id)!;
      boxes.push({ l: c.x - 12, r: c.x + 12, t: c.y + top - LABEL_ROOM_PX.above, b: c.y + bottom + LABEL_ROOM_PX.below });
    } else {
      const { width, height } = partSizes[entry.kind];
      boxes.push({ l: c.x - width / 2, r: c.x + width / 2, t: c.y - height / 2 - LABEL_ROOM_PX.above, b: c.y + height / 2 + LABEL_ROOM_PX.below });
    }
  }
  for (const wire of geometry.wires)
    for (let i = 1; i < wire.points.length; i++) {
      const [a, b] = [wire.points[i - 1], wire.points[i]];
      boxes.push({ l: Math.min(a.x, b.x), r: Math.max(a.x, b.x), t: Math.min(a.y, b.y) - 4, b: Math.max(a.y, b.y) + 4 });
    }
  const clashes = (p: XY) =>
    boxes.some(
      (box) =>
        p.x - size.width / 2 - LABEL_ROOM_PX.x < box.r &&
        box.l < p.x + size.width / 2 + LABEL_ROOM_PX.x &&
        p.y - size.height / 2 - LABEL_ROOM_PX.above < box.b &&
        box.t < p.y + size.height / 2 + LABEL_ROOM_PX.below,
    );
  let spot = at;
  for (let i = 0; i < 40 && clashes(spot); i++) spot = { x: spot.x + 2 * GRID_PX, y: spot.y + 2 * GRID_PX };
  return spot;
}
