// "Arrange": lay the chain out left to right, in the direction power flows from the slack source,
// with every element's words (name above, Readings below, see labelBoxes.ts) kept clear of every
// other element's. Linear after a sort, so a 400-bus drawing arranges at once.
//
// Columns: a busbar at n branches from the slack stands in column 2n + 1, a branch between
// busbars in the column after the nearer one, a load or shunt right of its busbar, a source left
// of it. Columns are as wide as their widest footprint, so nothing reaches into the next one.
// Rows: the busbars are walked from the slack, each busbar's parts placed before its further
// busbars, every part level with its busbar or below it, never higher than the lowest footprint
// already in its column. A branch and the busbar it leads to share one row, so chains run
// straight. A busbar's bar then reaches every wire that lands on it, and its Readings sit below
// that. Snapped to the sheet grid.
//
// What the walk cannot foresee (a ring's closing branch lengthening a bar already placed) is
// pulled apart sideways at the end: each overlapping pair opens a gap at the right-hand element
// and everything from there rightwards moves right by it. A move of everything past a vertical
// cut keeps the elements' order, changes no heights and cannot make a new overlap, so one pass
// leaves none.
import {
  BAR_HIT_WIDTH_PX,
  GRID_PX,
  anchorOf,
  busCenterMap,
  partSize,
  sheetGeometry,
  terminalBus,
  terminalsOf,
  type SheetContent,
  type SheetLayout,
  type XY,
} from "./flowModel.ts";
import { footprintOf, overlappingBoxes, sheetBoxes, type ShownReadings } from "./labelBoxes.ts";
import { distanceFromSlack } from "#solver/topology.ts";
import type { Network } from "#solver/schema.ts";
import type { ElementEntry } from "#app/lib/networkElements.ts";

const snapUp = (v: number) => Math.ceil(v / GRID_PX) * GRID_PX;
/** Space between footprints stacked in a column, and between columns. */
const ROW_GAP_PX = GRID_PX;
/** Between words of neighbouring columns, and the shortest wire between two symbols. */
const LABEL_CLEARANCE_PX = 6;
const MIN_WIRE_PX = 2 * GRID_PX;
/** A bar's least reach either side of its centre (flowModel's minimum). */
const BAR_MIN_HALF_PX = 40;
/** A wire lands on a bar this far from the bar's end, at least (flowModel's margin). */
const BAR_END_MARGIN_PX = 16;
/** Loose parts (connected to no busbar) stand in a column of their own on the left. */
const LOOSE_COLUMN = -2;

const childOrder = { source: 0, transformer: 1, line: 1, shunt: 2, load: 3, bus: 4 } as const;

function busesOf(entry: ElementEntry, busIds: ReadonlySet<string>): string[] {
  return terminalsOf(entry.kind)
    .map((t) => terminalBus(entry, t))
    .filter((b) => busIds.has(b));
}

function place(content: SheetContent, centres: Map<string, XY>): SheetContent {
  const document: Network = {
    ...content.document,
    buses: content.document.buses.map((b) => {
      const at = centres.get(b.id);
      return at ? { ...b, x: at.x, y: at.y } : b;
    }),
  };
  const busCenters = busCenterMap(document);
  const geometry = sheetGeometry(document, {});
  const layout: SheetLayout = {};
  for (const [id, entry] of geometry.entries) {
    if (entry.kind === "bus") continue;
    const at = centres.get(id);
    if (!at) continue;
    const anchor = anchorOf(entry, busCenters);
    layout[id] = { x: at.x - anchor.x, y: at.y - anchor.y };
  }
  return { document, layout };
}

/** Column and row of every element (rows in sheet pixels, columns as numbers). */
function walk(content: SheetContent, shown: ShownReadings): { column: Map<string, number>; y: Map<string, number>; boxes: Map<number, ColumnBox[]> } {
  const { entries, busCenters } = sheetGeometry(content.document, {});
  const busIds = new Set(busCenters.keys());
  const distance = distanceFromSlack(content.document);
  const attached = new Map<string, string[]>();
  for (const [id, entry] of entries)
    if (entry.kind !== "bus")
      for (const busId of new Set(busesOf(entry, busIds))) {
        const list = attached.get(busId);
        if (list) list.push(id);
        else attached.set(busId, [id]);
      }

  const column = new Map<string, number>();
  for (const [id, entry] of entries) {
    if (entry.kind === "bus") {
      column.set(id, 2 * (distance.get(id) ?? 0) + 1);
      continue;
    }
    const buses = busesOf(entry, busIds);
    if (buses.length === 0) column.set(id, LOOSE_COLUMN);
    else if (entry.kind === "transformer" || entry.kind === "line") column.set(id, 2 * Math.min(...buses.map((b) => distance.get(b) ?? 0)) + 2);
    else column.set(id, 2 * (distance.get(buses[0]) ?? 0) + 1 + (entry.kind === "source" ? -1 : 1));
  }

  const footprints = new Map([...entries].map(([id, entry]) => [id, footprintOf(entry, shown)]));
  // Reach above and below an element's centre, words included; a bar's below-reach is settled
  // when its busbar is finished.
  const up = (id: string) => {
    const entry = entries.get(id)!;
    const body = entry.kind === "bus" ? BAR_MIN_HALF_PX : partSize(entry.kind).height / 2;
    return body + footprints.get(id)!.above;
  };
  const down = (id: string) => {
    const entry = entries.get(id)!;
    const body = entry.kind === "bus" ? BAR_MIN_HALF_PX : partSize(entry.kind).height / 2;
    return body + footprints.get(id)!.below;
  };
  const nextFree = new Map<number, number>();
  const barBelow = new Map<string, number>();
  const y = new Map<string, number>();
  const lowest = () => Math.max(0, ...nextFree.values());
  const fit = (id: string, desired: number) => Math.max(desired, (nextFree.get(column.get(id)!) ?? -Infinity) + up(id));
  const put = (id: string, at: number) => {
    y.set(id, at);
    const col = column.get(id)!;
    nextFree.set(col, Math.max(nextFree.get(col) ?? -Infinity, at + down(id) + ROW_GAP_PX));
  };

  const finishBus = (busId: string) => {
    const at = y.get(busId)!;
    let reach = 0;
    for (const id of attached.get(busId) ?? []) {
      const landing = y.get(id);
      if (landing !== undefined) reach = Math.max(reach, landing - at);
    }
    const barBottom = at + Math.max(BAR_MIN_HALF_PX, snapUp(reach + BAR_END_MARGIN_PX));
    barBelow.set(busId, barBottom - at);
    const col = column.get(busId)!;
    nextFree.set(col, Math.max(nextFree.get(col)!, barBottom + footprints.get(busId)!.below + ROW_GAP_PX));
  };

  // Busbars in order of distance (the slack's first), each starting a walk if not yet reached.
  const roots = [...busIds].sort((a, b) => (distance.get(a) ?? 0) - (distance.get(b) ?? 0));
  const visited = new Set<string>();
  for (const root of roots) {
    if (visited.has(root)) continue;
    visited.add(root);
    put(root, snapUp(fit(root, lowest())));
    const stack: { busId: string; finish: boolean }[] = [{ busId: root, finish: false }];
    while (stack.length) {
      const { busId, finish } = stack.pop()!;
      if (finish) {
        finishBus(busId);
        continue;
      }
      stack.push({ busId, finish: true });
      const at = y.get(busId)!;
      const kids = (attached.get(busId) ?? []).filter((id) => !visited.has(id));
      kids.sort((a, b) => childOrder[entries.get(a)!.kind] - childOrder[entries.get(b)!.kind]);
      const further: string[] = [];
      for (const kid of kids) {
        visited.add(kid);
        const entry = entries.get(kid)!;
        const next = busesOf(entry, busIds).find((b) => b !== busId && !visited.has(b) && distance.get(b) === (distance.get(busId) ?? 0) + 1);
        if (next) {
          // The branch and the busbar it leads to share a row.
          visited.add(next);
          const row = snapUp(Math.max(fit(kid, at), fit(next, at)));
          put(kid, row);
          put(next, row);
          further.push(next);
        } else put(kid, snapUp(fit(kid, at)));
      }
      for (let i = further.length - 1; i >= 0; i--) stack.push({ busId: further[i], finish: false });
    }
  }
  for (const id of entries.keys()) if (!y.has(id)) put(id, snapUp(fit(id, 0)));
  // Each element's boxes (symbol or bar, name, Readings) as rows and half-widths about its column.
  const boxes = new Map<number, ColumnBox[]>();
  for (const [id, entry] of entries) {
    const at = y.get(id)!;
    const f = footprints.get(id)!;
    const top = at - (entry.kind === "bus" ? BAR_MIN_HALF_PX : partSize(entry.kind).height / 2);
    const bottom = at + (entry.kind === "bus" ? (barBelow.get(id) ?? BAR_MIN_HALF_PX) : partSize(entry.kind).height / 2);
    const body = entry.kind === "bus" ? BAR_HIT_WIDTH_PX / 2 : partSize(entry.kind).width / 2;
    const own: ColumnBox[] = [
      { t: top - f.above, b: top - (f.above - f.nameHeight), half: f.nameWidth / 2, body: false },
      { t: top, b: bottom, half: body, body: true },
    ];
    if (f.readingsHeight) own.push({ t: bottom + (f.below - f.readingsHeight), b: bottom + f.below, half: f.readingsWidth / 2, body: false });
    const col = column.get(id)!;
    const list = boxes.get(col);
    if (list) list.push(...own);
    else boxes.set(col, own);
  }
  return { column, y, boxes };
}

interface ColumnBox {
  t: number;
  b: number;
  half: number;
  /** A symbol or bar, which a wire joins: kept a wire's length from the next column's. */
  body: boolean;
}

/** The most `right` column's boxes must stand right of `left` column's, where their rows meet. */
function separation(left: ColumnBox[], right: ColumnBox[]): number {
  let need = -Infinity;
  let start = 0;
  for (const b of right) {
    while (start < left.length && left[start].b + LABEL_CLEARANCE_PX <= b.t) start++;
    for (let i = start; i < left.length && left[i].t < b.b + LABEL_CLEARANCE_PX; i++) {
      const a = left[i];
      if (a.b + LABEL_CLEARANCE_PX <= b.t) continue;
      need = Math.max(need, a.half + b.half + (a.body && b.body ? MIN_WIRE_PX : LABEL_CLEARANCE_PX));
    }
  }
  return need;
}

/**
 * Column centres, left to right: each column as close to the ones before as their boxes allow
 * where their rows meet (a wide name beside a short bar takes no room from it), and a wire's
 * length between symbols.
 */
function columnCentres(boxes: Map<number, ColumnBox[]>): Map<number, number> {
  const columns = [...boxes.keys()].sort((a, b) => a - b);
  const widest = new Map(columns.map((c) => [c, Math.max(...boxes.get(c)!.map((box) => box.half))]));
  for (const c of columns) boxes.get(c)!.sort((a, b) => a.t - b.t);
  const centres = new Map<number, number>();
  columns.forEach((c, i) => {
    let x = 0;
    // Look back only as far as a column whose widest box could still reach this one.
    for (let k = i - 1; k >= 0; k--) {
      const earlier = columns[k];
      const at = centres.get(earlier)!;
      if (k < i - 1 && at + widest.get(earlier)! + widest.get(c)! + MIN_WIRE_PX <= x) break;
      const need = separation(boxes.get(earlier)!, boxes.get(c)!);
      if (need > -Infinity) x = Math.max(x, at + need);
      if (k === i - 1) x = Math.max(x, at + MIN_WIRE_PX);
    }
    centres.set(c, snapUp(x));
  });
  return centres;
}

/** Move everything right of each overlap far enough right to clear it (see the note at the top). */
function pullApartSideways(content: SheetContent, centres: Map<string, XY>, shown: ShownReadings): Map<string, XY> {
  const placed = place(content, centres);
  const pairs = overlappingBoxes(sheetBoxes(sheetGeometry(placed.document, placed.layout), shown));
  if (pairs.length === 0) return centres;
  const order = new Map([...centres.keys()].map((id, i) => [id, i]));
  const compare = (a: string, b: string) => centres.get(a)!.x - centres.get(b)!.x || order.get(a)! - order.get(b)!;
  const gapAt = new Map<string, number>();
  for (const [p, q] of pairs) {
    const [left, right] = compare(p.owner, q.owner) < 0 ? [p, q] : [q, p];
    const gap = snapUp(left.r - right.l + 1);
    gapAt.set(right.owner, Math.max(gapAt.get(right.owner) ?? 0, gap));
  }
  const cuts = [...gapAt.keys()].sort(compare);
  const moved = new Map<string, XY>();
  let shift = 0;
  let next = 0;
  for (const id of [...centres.keys()].sort(compare)) {
    while (next < cuts.length && compare(cuts[next], id) <= 0) shift += gapAt.get(cuts[next++])!;
    const at = centres.get(id)!;
    moved.set(id, { x: at.x + shift, y: at.y });
  }
  return moved;
}

/** Arranged for the Readings the sheet shows now (with or without fault levels). */
export function arrangeLeftToRight(content: SheetContent, shown: ShownReadings = { faults: false }): SheetContent {
  const { column, y, boxes } = walk(content, shown);
  const x = columnCentres(boxes);
  const centres = new Map<string, XY>();
  for (const [id, col] of column) centres.set(id, { x: x.get(col)!, y: y.get(id)! });
  return place(content, pullApartSideways(content, centres, shown));
}
