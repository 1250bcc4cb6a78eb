// The difference between two revisions of a network, in a reviewer's words: elements added,
// removed and changed, each change field by field with its unit ("Length: 48 km → 52 km").
// Pure: the revisions page, the API and the tests call it with two validated documents.
import type { Network } from "#solver/schema.ts";
import { QUANTITY_UNIT } from "#solver/quantities.ts";
import { catalogueField, FIELD_CATALOGUE } from "./fieldCatalogue.ts";
import { ELEMENT_COLLECTIONS, KIND_LABEL, KIND_OF_COLLECTION, type ElementCollection } from "./networkElements.ts";

type Value = string | number | boolean | null | undefined;

export interface FieldChange {
  field: string;
  label: string;
  /** The unit the field's name carries ("kV", "Ω/km"), or null for a ratio, a name or a choice. */
  unit: string | null;
  from: Value;
  to: Value;
  /** The values as a person reads them, unit included; "(none)" for a field not set. */
  fromText: string;
  toText: string;
}

export interface ElementSummary {
  id: string;
  name: string;
  kind: string;
  collection: ElementCollection;
}

export interface ElementChange extends ElementSummary {
  changes: FieldChange[];
}

export interface RevisionDiff {
  /** The network's own fields: name, frequency, power base. */
  network: FieldChange[];
  added: ElementSummary[];
  removed: ElementSummary[];
  changed: ElementChange[];
  unchanged: number;
}

export function unitOfField(field: string): string | null {
  const entry = catalogueField(field);
  return entry?.unit ?? (entry?.quantity ? QUANTITY_UNIT[entry.quantity] || null : null);
}

const BUS_REFERENCES = new Set(["bus", "hvBus", "lvBus", "fromBus", "toBus"]);
/** x and y are one fact to a reader (where the symbol sits), shown as one change. */
const POSITION_FIELDS = new Set(["x", "y"]);
const NETWORK_FIELDS = ["name", "frequencyHz", "baseMVA"] as const;

type AnyElement = Record<string, Value> & { id: string; name: string };

function valueText(value: Value, unit: string | null): string {
  if (value === undefined || value === null) return "(none)";
  if (typeof value === "number") return unit ? `${value} ${unit}` : String(value);
  return String(value);
}

function fieldChange(field: string, from: Value, to: Value, texts?: { fromText: string; toText: string }): FieldChange {
  const unit = unitOfField(field);
  return {
    field,
    label: catalogueField(field)?.label ?? field,
    unit,
    from,
    to,
    fromText: texts?.fromText ?? valueText(from, unit),
    toText: texts?.toText ?? valueText(to, unit),
  };
}

function busText(network: Network, busId: Value): string {
  if (typeof busId !== "string") return "(none)";
  const bus = network.buses.find((b) => b.id === busId);
  return bus ? bus.name : `a bus not in this revision`;
}

function positionText(element: AnyElement): string {
  return element.x === undefined && element.y === undefined ? "(not placed)" : `x ${element.x ?? "–"}, y ${element.y ?? "–"}`;
}

/** Field order: the catalogue's order (the document's reading order), then any others by name. */
const FIELD_ORDER = new Map(Object.keys(FIELD_CATALOGUE).map((field, i) => [field, i]));
function byFieldOrder(a: string, b: string): number {
  return (FIELD_ORDER.get(a) ?? 1000) - (FIELD_ORDER.get(b) ?? 1000) || a.localeCompare(b);
}

function compareElements(before: AnyElement, after: AnyElement, beforeNet: Network, afterNet: Network): FieldChange[] {
  const fields = new Set([...Object.keys(before), ...Object.keys(after)]);
  fields.delete("id");
  const changes: FieldChange[] = [];
  let moved = false;
  for (const field of [...fields].sort(byFieldOrder)) {
    const from = before[field];
    const to = after[field];
    // Nested settings (a tap changer's control) compare by content, not by identity.
    if (from === to || (typeof from === "object" && typeof to === "object" && JSON.stringify(from) === JSON.stringify(to))) continue;
    if (POSITION_FIELDS.has(field)) {
      moved = true;
      continue;
    }
    if (BUS_REFERENCES.has(field)) {
      changes.push(fieldChange(field, from, to, { fromText: busText(beforeNet, from), toText: busText(afterNet, to) }));
    } else {
      changes.push(fieldChange(field, from, to));
    }
  }
  if (moved) {
    changes.push(fieldChange("position", null, null, { fromText: positionText(before), toText: positionText(after) }));
  }
  return changes;
}

export function diffRevisions(before: Network, after: Network): RevisionDiff {
  const diff: RevisionDiff = { network: [], added: [], removed: [], changed: [], unchanged: 0 };
  for (const field of NETWORK_FIELDS) {
    if (before[field] !== after[field]) diff.network.push(fieldChange(field, before[field], after[field]));
  }
  for (const collection of ELEMENT_COLLECTIONS) {
    const kind = KIND_LABEL[KIND_OF_COLLECTION[collection]];
    const beforeById = new Map((before[collection] as AnyElement[]).map((e) => [e.id, e]));
    const afterById = new Map((after[collection] as AnyElement[]).map((e) => [e.id, e]));
    for (const [id, element] of beforeById) {
      if (!afterById.has(id)) diff.removed.push({ id, name: element.name, kind, collection });
    }
    for (const [id, element] of afterById) {
      const old = beforeById.get(id);
      if (!old) {
        diff.added.push({ id, name: element.name, kind, collection });
        continue;
      }
      const changes = compareElements(old, element, before, after);
      if (changes.length === 0) diff.unchanged++;
      else diff.changed.push({ id, name: element.name, kind, collection, changes });
    }
  }
  return diff;
}

/** "2 added, 1 removed, 3 changed" or "no differences". */
export function diffSummary(diff: RevisionDiff): string {
  const parts = [
    diff.network.length ? `${diff.network.length} network ${diff.network.length === 1 ? "field" : "fields"} changed` : "",
    diff.added.length ? `${diff.added.length} added` : "",
    diff.removed.length ? `${diff.removed.length} removed` : "",
    diff.changed.length ? `${diff.changed.length} changed` : "",
  ].filter(Boolean);
  return parts.length ? parts.join(", ") : "no differences";
}
