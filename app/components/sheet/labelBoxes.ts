// Where the sheet's words sit, as boxes in sheet coordinates: each element's name (with its
// sub-line: rating, tap, kV), its Readings below, a busbar's name and kV above its bar, and the
// symbols and bars themselves. Arrange keeps these apart and the tests count overlaps with the
// same boxes. Pure: the node components take their sub-lines from here, and widths come from
// Barlow's own advance widths (measured in Chromium), so no browser is needed to lay words out.
import type { Bus, Line, Load, Shunt, Source, Transformer } from "#solver/schema.ts";
import type { AnyElement, ElementEntry, ElementKind } from "#app/lib/networkElements.ts";
import { BAR_HIT_WIDTH_PX, partSize, type SheetGeometry } from "./flowModel.ts";

/** Barlow SemiBold advance widths in hundredths of an em, for the characters below (the widest of 400–600). */
const MEASURED_CHARACTERS = " !\"#$%&'()*+,-./0123456789:;<=>?@ABCDEFGHIJKLMNOPQRSTUVWXYZ[\\]^_`abcdefghijklmnopqrstuvwxyz{|}~▶◀·∠−°″✓✕⚠△×▲▼–";
const MEASURED_WIDTHS = [
  20, 34, 33, 68, 57, 85, 69, 16, 32, 32, 40, 50, 27, 34, 28, 45, 54, 54, 54, 54, 54, 54, 54, 54, 54, 54, 36, 31, 50, 50, 50, 50, 83, 65, 63,
  61, 62, 61, 57, 61, 65, 26, 58, 62, 57, 72, 66, 62, 60, 59, 61, 59, 58, 65, 61, 88, 62, 60, 55, 40, 45, 40, 47, 51, 22, 52, 56, 53, 56, 54, 38,
  55, 54, 26, 25, 52, 24, 83, 54, 56, 56, 56, 38, 48, 37, 54, 50, 76, 52, 49, 46, 35, 19, 35, 52, 77, 77, 23, 90, 50, 38, 37, 84, 84, 90, 77, 44,
  99, 99, 47,
];
const CHARACTER_WIDTH = new Map([...MEASURED_CHARACTERS].map((c, i) => [c, MEASURED_WIDTHS[i] / 100]));
/** Letters outside the table (accents, other scripts) count as wide ones. */
const UNKNOWN_CHARACTER_EM = 0.9;

/** The drawn width of a text at a font size, rounded up with a pixel to spare. */
export function textWidthPx(text: string, fontPx: number): number {
  let em = 0;
  for (const c of text) em += CHARACTER_WIDTH.get(c) ?? UNKNOWN_CHARACTER_EM;
  return Math.ceil(em * fontPx) + 1;
}

// The sizes sheet.css gives the words (font size × line height, padding and border).
const NAME_FONT_PX = 11;

/** The room an element's name takes at normal size: zoomed out, its larger words are cut to it. */
export function nameRoomPx(name: string): number {
  return textWidthPx(name, NAME_FONT_PX);
}
const NAME_LINE_PX = 11 * 1.2;
const SUB_FONT_PX = 10;
const SUB_LINE_PX = 10 * 1.2;
const LABEL_GAP_PX = 3;
const READING_FONT_PX = 10.5;
const READING_LINE_PX = 10.5 * 1.35;
/** Readings box: 1 px padding and 1 px border above and below, 5 px padding and 1 px border beside. */
const READING_FRAME_Y_PX = 4;
const READING_FRAME_X_PX = 12;
const READING_GAP_PX = 4;

/** The line under an element's name: its rating, tap or length. The node components show this text. */
export function nameSubLine(kind: ElementKind, element: AnyElement): string {
  switch (kind) {
    case "transformer": {
      const t = element as Transformer;
      return `${t.ratedMVA} MVA · ${t.hvKV}/${t.lvKV} kV${t.tapPct ? ` · tap ${t.tapPct > 0 ? "+" : ""}${t.tapPct} %` : ""}`;
    }
    case "line": {
      const line = element as Line;
      return `${line.lengthKm} km ${line.kind === "cable" ? "cable" : "overhead"}`;
    }
    case "source": {
      const source = element as Source;
      return source.control === "slack" ? "slack" : source.control.toUpperCase();
    }
    case "load": {
      const load = element as Load;
      return `${load.pMW} MW · ${load.qMvar} Mvar`;
    }
    case "shunt":
      return `${(element as Shunt).qMvar} Mvar`;
    case "bus":
      return `${(element as Bus).nominalKV} kV`;
  }
}

/** What the sheet shows besides names: the fault levels are a toggle (Fault levels in the toolbar). */
export interface ShownReadings {
  faults: boolean;
  /** When the case picker shows the envelope of all cases: the longest case name, which its Readings carry. */
  envelopeCase?: string;
}

/**
 * The longest Readings an element can show, with every figure at its widest (the sheet writes
 * at most five significant figures and a sign), so a layout made before a solve, or kept while
 * the numbers change, still has room for them.
 */
function widestReadings(entry: ElementEntry, shown: ShownReadings): string[] {
  switch (entry.kind) {
    case "bus": {
      const bus = entry.element as Bus;
      const lines =
        shown.envelopeCase !== undefined
          ? [`lowest 1.0005 pu · ${shown.envelopeCase} ✕`, `highest 1.0005 pu · ${shown.envelopeCase} ✕`]
          : ["−1234.5 kV ✕", "1.0005 pu ∠ −123.45°"];
      if (shown.faults)
        lines.push("I″k3 123.45 kA · I″k1 123.45 kA ✕", `S″k3 min 12345.6 MVA${bus.minFaultMVA !== undefined ? " (asked 12345.6)" : ""} ✕`);
      return lines;
    }
    case "transformer":
    case "line": {
      if (shown.envelopeCase !== undefined) return [`highest 123.45 % · ${shown.envelopeCase} ✕`];
      const lines = ["▶ 1234.5 MW ▶ 1234.5 Mvar", "loss 12345.6 kW · 123.45 % ✕"];
      if (entry.kind === "transformer" && (entry.element as Transformer).tapControl) lines.push("regulating: tap +12.34 % · range ran out ✕");
      return lines;
    }
    case "source": {
      const lines = ["−1234.5 MW · −1234.5 Mvar"];
      if (shown.faults && (entry.element as Source).kind === "converter") lines.push("SCR 123.45 ✕");
      return lines;
    }
    default:
      return [];
  }
}

export type BoxPart = "symbol" | "bar" | "name" | "readings";

export interface LabelBox {
  owner: string;
  part: BoxPart;
  l: number;
  r: number;
  t: number;
  b: number;
}

/** An element's words and symbol relative to its centre (for a busbar, to its bar's ends). */
export interface ElementFootprint {
  /** Half the widest of symbol, name and Readings. */
  halfWidth: number;
  /** From the top of the symbol (or bar) to the top of the name. */
  above: number;
  /** From the bottom of the symbol (or bar) to the bottom of the Readings. */
  below: number;
  nameWidth: number;
  nameHeight: number;
  readingsWidth: number;
  readingsHeight: number;
}

export function footprintOf(entry: ElementEntry, shown: ShownReadings): ElementFootprint {
  const nameWidth = Math.max(textWidthPx(entry.element.name, NAME_FONT_PX), textWidthPx(nameSubLine(entry.kind, entry.element), SUB_FONT_PX));
  const nameHeight = Math.ceil(NAME_LINE_PX + SUB_LINE_PX);
  const lines = widestReadings(entry, shown);
  const readingsWidth = lines.length ? Math.max(...lines.map((l) => textWidthPx(l, READING_FONT_PX))) + READING_FRAME_X_PX : 0;
  // A fault line carries a dotted rule above it.
  const rules = entry.kind === "bus" && shown.faults ? 2 : 0;
  const readingsHeight = lines.length ? Math.ceil(lines.length * READING_LINE_PX + READING_FRAME_Y_PX + rules) : 0;
  const symbolWidth = entry.kind === "bus" ? BAR_HIT_WIDTH_PX : partSize(entry.kind).width;
  return {
    halfWidth: Math.max(symbolWidth, nameWidth, readingsWidth) / 2,
    above: LABEL_GAP_PX + nameHeight,
    below: readingsHeight ? READING_GAP_PX + readingsHeight : 0,
    nameWidth,
    nameHeight,
    readingsWidth,
    readingsHeight,
  };
}

/** Every box of the drawing: symbols, bars, names and Readings, in sheet coordinates. */
export function sheetBoxes(geometry: SheetGeometry, shown: ShownReadings): LabelBox[] {
  const boxes: LabelBox[] = [];
  for (const [id, entry] of geometry.entries) {
    const c = geometry.centers.get(id)!;
    const f = footprintOf(entry, shown);
    let top: number;
    let bottom: number;
    if (entry.kind === "bus") {
      const bar = geometry.busExtents.get(id)!;
      top = c.y + bar.top;
      bottom = c.y + bar.bottom;
      boxes.push({ owner: id, part: "bar", l: c.x - BAR_HIT_WIDTH_PX / 2, r: c.x + BAR_HIT_WIDTH_PX / 2, t: top, b: bottom });
    } else {
      const size = partSize(entry.kind);
      top = c.y - size.height / 2;
      bottom = c.y + size.height / 2;
      boxes.push({ owner: id, part: "symbol", l: c.x - size.width / 2, r: c.x + size.width / 2, t: top, b: bottom });
    }
    const nameBottom = top - LABEL_GAP_PX;
    boxes.push({ owner: id, part: "name", l: c.x - f.nameWidth / 2, r: c.x + f.nameWidth / 2, t: nameBottom - f.nameHeight, b: nameBottom });
    if (f.readingsHeight) {
      const readingsTop = bottom + READING_GAP_PX;
      boxes.push({ owner: id, part: "readings", l: c.x - f.readingsWidth / 2, r: c.x + f.readingsWidth / 2, t: readingsTop, b: readingsTop + f.readingsHeight });
    }
  }
  return boxes;
}

const BUCKET_PX = 160;

/**
 * Pairs of boxes of different elements that overlap, found through grid buckets (each box is
 * compared only with boxes sharing a bucket, and a pair is counted in one bucket only), so a
 * drawing of hundreds of buses costs about as much as its boxes, not their pairs.
 */
export function overlappingBoxes(boxes: readonly LabelBox[]): [LabelBox, LabelBox][] {
  const buckets = new Map<string, number[]>();
  const cell = (v: number) => Math.floor(v / BUCKET_PX);
  boxes.forEach((box, i) => {
    for (let cx = cell(box.l); cx <= cell(box.r); cx++)
      for (let cy = cell(box.t); cy <= cell(box.b); cy++) {
        const key = `${cx},${cy}`;
        const list = buckets.get(key);
        if (list) list.push(i);
        else buckets.set(key, [i]);
      }
  });
  const pairs: [LabelBox, LabelBox][] = [];
  for (const [key, list] of buckets) {
    const [cx, cy] = key.split(",").map(Number);
    for (let i = 0; i < list.length; i++)
      for (let j = i + 1; j < list.length; j++) {
        const a = boxes[list[i]];
        const b = boxes[list[j]];
        if (a.owner === b.owner) continue;
        const l = Math.max(a.l, b.l);
        const t = Math.max(a.t, b.t);
        if (l >= Math.min(a.r, b.r) || t >= Math.min(a.b, b.b)) continue;
        // Count the pair only in the bucket holding the top-left corner of their common part.
        if (cell(l) === cx && cell(t) === cy) pairs.push([a, b]);
      }
  }
  return pairs;
}
