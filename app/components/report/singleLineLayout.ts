// A left-to-right single-line drawing computed from the network file alone: each slack source's
// bus on the left, every branch one column further from it, buses as vertical bars. Rows are
// dealt out depth first, so a plain chain stays on one straight row and a bus that feeds several
// branches spans their rows. Loads, shunts and other sources hang off the right of their bus on
// rows of their own; slack sources sit on the left of theirs.
import type { Network } from "#solver/schema.ts";

/** Drawings of more buses than this are left out (report, ladder page), each saying so in a sentence: no page can show them legibly. */
export const DRAWING_MAX_BUSES = 400;

export const COLUMN_WIDTH = 170;
export const ROW_HEIGHT = 140;
export const LEFT_MARGIN = 130;
export const TOP_MARGIN = 64;
/** Below the last row: room for the labels under its branch (name and two lines of details). */
export const BOTTOM_MARGIN = 84;
/** Text sizes the drawing uses (px in the drawing's own units), for estimating label widths. */
export const NAME_PX = 12.5;
export const DETAIL_PX = 11.5;
/** Names longer than this many characters are wrapped under branches and beside attachments. */
const WRAP_CHARACTERS = 24;
/** Where a right-hand attachment's text starts, from its bus bar: stub, symbol and a gap. */
export const ATTACHMENT_TEXT_OFFSET = 22 + 56 + 6;
/** How far a bus bar reaches beyond its first and last connection. */
export const BAR_OVERHANG = 24;

export interface PlacedBus {
  id: string;
  name: string;
  nominalKV: number;
  column: number;
  x: number;
  /** Rows of the bus's connections, first to last. */
  firstRow: number;
  lastRow: number;
  yTop: number;
  yBottom: number;
}

export interface PlacedBranch {
  id: string;
  name: string;
  kind: "transformer" | "overhead" | "cable";
  /** The bus nearer the source (drawn on the left) and the one further away. */
  leftBusId: string;
  rightBusId: string;
  leftKV: number;
  rightKV: number;
  x1: number;
  x2: number;
  y: number;
  /** The name, wrapped to fit between two columns. */
  nameLines: string[];
  /** For transformers: whether the HV winding faces the left bus. */
  hvOnLeft: boolean;
  tapChanger: boolean;
  details: string[];
}

/** A branch that closes a loop: drawn under the drawing from one bus to the other; a transformer's "from" is its HV bus. */
export interface LoopBranch {
  id: string;
  name: string;
  kind: "transformer" | "overhead" | "cable";
  fromBusId: string;
  toBusId: string;
  fromX: number;
  toX: number;
  fromY: number;
  toY: number;
  y: number;
  fromKV: number;
  toKV: number;
  tapChanger: boolean;
  nameLines: string[];
  details: string[];
}

export type AttachmentKind = "load" | "capacitor" | "reactor" | "generator" | "converter" | "grid";

export interface PlacedAttachment {
  id: string;
  name: string;
  kind: AttachmentKind;
  busId: string;
  nominalKV: number;
  side: "left" | "right";
  /** Where the stub leaves the bus bar. */
  x: number;
  y: number;
  nameLines: string[];
  details: string[];
}

export interface SingleLineLayout {
  /** The drawing's extent in its own units: the viewBox, labels included. */
  minX: number;
  width: number;
  height: number;
  buses: PlacedBus[];
  branches: PlacedBranch[];
  loops: LoopBranch[];
  attachments: PlacedAttachment[];
}

const num = (value: number, digits = 3) => String(Number(value.toFixed(digits)));
const signed = (value: number) => (value > 0 ? `+${num(value, 2)}` : num(value, 2));

interface Edge {
  id: string;
  name: string;
  kind: "transformer" | "overhead" | "cable";
  a: string;
  b: string;
}

type Transformer = Network["transformers"][number];
type Line = Network["lines"][number];

function branchDetails(transformers: Map<string, Transformer>, lines: Map<string, Line>, edge: Edge): string[] {
  if (edge.kind === "transformer") {
    const t = transformers.get(edge.id)!;
    return [`${num(t.ratedMVA)} MVA, ${num(t.hvKV)}/${num(t.lvKV)} kV`, `uₖ ${num(t.impedancePct, 2)} %, ${t.vectorGroup}, tap ${signed(t.tapPct)} %`];
  }
  const l = lines.get(edge.id)!;
  return [`${num(l.lengthKm)} km ${l.kind === "cable" ? "cable" : "overhead"}`, `${num(l.rOhmPerKm, 4)} + j${num(l.xOhmPerKm, 4)} Ω/km`];
}

/** Appends to the list kept under `key`, making the list on first use: no copying per append. */
function pushTo<K, V>(map: Map<K, V[]>, key: K, value: V): void {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
}

/**
 * Linear in the size of the network: every walk is iterative (no recursion, so a chain of any
 * length fits the stack) and every lookup goes through a map built once.
 */
export function layoutSingleLine(network: Network): SingleLineLayout {
  const busById = new Map(network.buses.map((b) => [b.id, b]));
  const transformerById = new Map(network.transformers.map((t) => [t.id, t]));
  const lineById = new Map(network.lines.map((l) => [l.id, l]));
  const edges: Edge[] = [
    ...network.transformers.map((t) => ({ id: t.id, name: t.name, kind: "transformer" as const, a: t.hvBus, b: t.lvBus })),
    ...network.lines.map((l) => ({ id: l.id, name: l.name, kind: l.kind, a: l.fromBus, b: l.toBus })),
  ].filter((e) => busById.has(e.a) && busById.has(e.b) && e.a !== e.b);
  // Branches in drawing order: as they lead away from the source, transformers and lines alike in file order.
  const edgesAt = new Map<string, Edge[]>();
  for (const e of edges) {
    pushTo(edgesAt, e.a, e);
    pushTo(edgesAt, e.b, e);
  }

  const slackBuses = network.sources.filter((s) => s.control === "slack" && busById.has(s.bus)).map((s) => s.bus);
  const roots = [...new Set([...slackBuses, ...network.buses.map((b) => b.id)])];

  // Breadth first from each root gives each bus its column and its parent branch.
  const column = new Map<string, number>();
  const treeEdge = new Set<string>();
  const children = new Map<string, { edge: Edge; child: string }[]>();
  const rootOrder: string[] = [];
  for (const root of roots) {
    if (column.has(root)) continue;
    rootOrder.push(root);
    column.set(root, 0);
    const queue = [root];
    for (let head = 0; head < queue.length; head++) {
      const bus = queue[head];
      for (const edge of edgesAt.get(bus) ?? []) {
        const other = edge.a === bus ? edge.b : edge.a;
        if (column.has(other)) continue;
        column.set(other, column.get(bus)! + 1);
        treeEdge.add(edge.id);
        pushTo(children, bus, { edge, child: other });
        queue.push(other);
      }
    }
  }

  const leftSources = new Map<string, typeof network.sources>();
  const rightItems = new Map<string, { id: string; name: string; kind: AttachmentKind; details: string[] }[]>();
  const addRight = (bus: string, item: { id: string; name: string; kind: AttachmentKind; details: string[] }) => pushTo(rightItems, bus, item);
  const isRoot = new Set(rootOrder);
  for (const s of network.sources) {
    if (!busById.has(s.bus)) continue;
    if (isRoot.has(s.bus) && s.control === "slack") pushTo(leftSources, s.bus, s);
    else addRight(s.bus, { id: s.id, name: s.name, kind: s.kind, details: sourceDetails(s) });
  }
  for (const ld of network.loads) {
    if (busById.has(ld.bus)) addRight(ld.bus, { id: ld.id, name: ld.name, kind: "load", details: [`${num(ld.pMW)} MW, ${num(ld.qMvar)} Mvar`] });
  }
  for (const sh of network.shunts) {
    if (busById.has(sh.bus))
      addRight(sh.bus, { id: sh.id, name: sh.name, kind: sh.qMvar >= 0 ? "capacitor" : "reactor", details: [`${num(Math.abs(sh.qMvar))} Mvar`] });
  }

  const rowSpan = new Map<string, { first: number; last: number }>();
  const branchRow = new Map<string, number>();
  const attachmentRow = new Map<string, number>();
  let nextRow = 0;
  // Depth first: a bus's children in turn, then what hangs off it; each takes rows from nextRow.
  // The bus bar spans only the rows where something connects to it, not its subtree's. An
  // explicit stack of the buses being placed stands in for recursion.
  interface Placing {
    bus: string;
    first: number;
    last: number;
    nextChild: number;
  }
  const open = (bus: string): Placing => ({ bus, first: nextRow, last: nextRow + Math.max(1, leftSources.get(bus)?.length ?? 0) - 1, nextChild: 0 });
  for (const root of rootOrder) {
    const stack: Placing[] = [open(root)];
    while (stack.length > 0) {
      const top = stack[stack.length - 1];
      const below = children.get(top.bus) ?? [];
      if (top.nextChild < below.length) {
        const { edge, child } = below[top.nextChild++];
        branchRow.set(edge.id, nextRow);
        top.last = Math.max(top.last, nextRow);
        stack.push(open(child));
        continue;
      }
      for (const item of rightItems.get(top.bus) ?? []) {
        attachmentRow.set(item.id, nextRow);
        top.last = Math.max(top.last, nextRow++);
      }
      nextRow = Math.max(nextRow, top.last + 1);
      rowSpan.set(top.bus, { first: top.first, last: top.last });
      stack.pop();
    }
  }

  const xOf = (bus: string) => LEFT_MARGIN + column.get(bus)! * COLUMN_WIDTH;
  const yOf = (row: number) => TOP_MARGIN + row * ROW_HEIGHT;

  const buses: PlacedBus[] = network.buses.map((b) => {
    const span = rowSpan.get(b.id)!;
    return {
      id: b.id,
      name: b.name,
      nominalKV: b.nominalKV,
      column: column.get(b.id)!,
      x: xOf(b.id),
      firstRow: span.first,
      lastRow: span.last,
      yTop: yOf(span.first) - BAR_OVERHANG,
      yBottom: yOf(span.last) + BAR_OVERHANG,
    };
  });

  const branches: PlacedBranch[] = [];
  for (const [bus, list] of children) {
    for (const { edge, child } of list) {
      branches.push({
        id: edge.id,
        name: edge.name,
        kind: edge.kind,
        leftBusId: bus,
        rightBusId: child,
        leftKV: busById.get(bus)!.nominalKV,
        rightKV: busById.get(child)!.nominalKV,
        x1: xOf(bus),
        x2: xOf(child),
        y: yOf(branchRow.get(edge.id)!),
        nameLines: wrapName(edge.name),
        hvOnLeft: edge.kind === "transformer" ? edge.a === bus : true,
        tapChanger: edge.kind === "transformer" && isOnLoadTapChanger(transformerById.get(edge.id)!),
        details: branchDetails(transformerById, lineById, edge),
      });
    }
  }
  const order = new Map(edges.map((e, i) => [e.id, i]));
  branches.sort((p, q) => order.get(p.id)! - order.get(q.id)!);

  const lastRow = Math.max(0, nextRow - 1);
  const loopEdges = edges.filter((e) => !treeEdge.has(e.id));
  const placedById = new Map(buses.map((b) => [b.id, b]));
  const loops: LoopBranch[] = loopEdges.map((e, i) => {
    const from = placedById.get(e.a)!;
    const to = placedById.get(e.b)!;
    return {
      id: e.id,
      name: e.name,
      kind: e.kind,
      fromBusId: e.a,
      toBusId: e.b,
      fromX: from.x,
      toX: to.x,
      fromY: from.yBottom,
      toY: to.yBottom,
      y: yOf(lastRow) + ROW_HEIGHT * (0.6 + i * 0.75),
      fromKV: from.nominalKV,
      toKV: to.nominalKV,
      tapChanger: e.kind === "transformer" && isOnLoadTapChanger(transformerById.get(e.id)!),
      nameLines: wrapName(e.name),
      details: branchDetails(transformerById, lineById, e),
    };
  });

  const attachments: PlacedAttachment[] = [];
  for (const bus of buses) {
    (leftSources.get(bus.id) ?? []).forEach((s, i) =>
      attachments.push({
        id: s.id,
        name: s.name,
        kind: s.kind,
        busId: bus.id,
        nominalKV: bus.nominalKV,
        side: "left",
        x: bus.x,
        y: yOf(bus.firstRow + i),
        nameLines: wrapName(s.name),
        details: sourceDetails(s),
      }),
    );
    for (const item of rightItems.get(bus.id) ?? [])
      attachments.push({
        ...item,
        busId: bus.id,
        nominalKV: bus.nominalKV,
        side: "right",
        x: bus.x,
        y: yOf(attachmentRow.get(item.id)!),
        nameLines: wrapName(item.name),
      });
  }

  // The extent, labels included, estimated from their lengths (the drawing is laid out on the
  // server, where text cannot be measured).
  const labelWidth = (names: string[], details: string[]) =>
    Math.max(...names.map((n) => textWidth(n, NAME_PX)), ...details.map((d) => textWidth(d, DETAIL_PX)));
  const extents: [number, number][] = [
    ...buses.map((b): [number, number] => {
      const half = labelWidth([b.name], []) / 2;
      return [b.x - half, b.x + half];
    }),
    ...[...branches.map((b) => ({ mid: (b.x1 + b.x2) / 2, b })), ...loops.map((b) => ({ mid: (b.fromX + b.toX) / 2, b }))].map(
      ({ mid, b }): [number, number] => {
        const half = labelWidth(b.nameLines, b.details) / 2;
        return [mid - half, mid + half];
      },
    ),
    ...attachments.map((a): [number, number] =>
      a.side === "left"
        ? [a.x - 10 - Math.max(labelWidth(a.nameLines, a.details), 78), a.x]
        : [a.x, a.x + ATTACHMENT_TEXT_OFFSET + labelWidth(a.nameLines, a.details)],
    ),
  ];
  // A loop, not Math.min(...list): spreading 100,000 arguments overflows the stack.
  let minX = Infinity;
  let maxX = -Infinity;
  for (const [left, right] of extents) {
    if (left < minX) minX = left;
    if (right > maxX) maxX = right;
  }
  minX -= 8;
  maxX += 8;
  const loopDepth = loops.length > 0 ? loops[loops.length - 1].y + 70 : 0;
  return {
    minX,
    width: maxX - minX,
    height: Math.max(yOf(lastRow) + BOTTOM_MARGIN, loopDepth),
    buses,
    branches,
    loops,
    attachments,
  };
}

/** Barlow's average advance is a little over half its size; a generous estimate keeps labels inside. */
function textWidth(text: string, px: number): number {
  return text.length * px * 0.56;
}

function wrapName(name: string): string[] {
  const lines: string[] = [];
  // A voltage stays with its unit: "66 kV" is one word here.
  for (const word of name.split(/\s+(?!kV\b)/)) {
    const last = lines[lines.length - 1];
    if (last !== undefined && (last + " " + word).length <= WRAP_CHARACTERS) lines[lines.length - 1] = `${last} ${word}`;
    else lines.push(word);
  }
  return lines;
}

function sourceDetails(s: Network["sources"][number]): string[] {
  if (s.kind === "grid") return [`S″kQ ${num(s.shortCircuitMVA ?? 0)} MVA`, `${s.control}, ${num(s.voltagePu)} pu`];
  return [`${num(s.ratedMVA ?? 0)} MVA, x″d ${num(s.xdSubtransientPct ?? 0, 2)} %`, `${s.control}, ${num(s.voltagePu)} pu`];
}

/** A transformer with a tap range is drawn with the tap changer's arrow, as on the sheet. */
function isOnLoadTapChanger(t: Transformer): boolean {
  return t.tapMinPct !== undefined || t.tapMaxPct !== undefined;
}
