// Which fields Details shows for each element, in the order a planner fills them, with the unit
// each field reads; validation comes from the element schemas of the network file.
import type { z } from "zod";
import {
  busSchema,
  lineSchema,
  loadSchema,
  shuntSchema,
  sourceSchema,
  transformerSchema,
  type Source,
} from "#solver/schema.ts";
import type { QuantityKind } from "#app/lib/unitFormat.ts";
import { FIELD_CATALOGUE, type CatalogueField, type CatalogueKey } from "#app/lib/fieldCatalogue.ts";
import type { TerminalId } from "./flowModel.ts";
import { type AnyElement, type ElementKind } from "#app/lib/networkElements.ts";

export type FieldDef =
  | { type: "text"; key: string; label: string }
  | { type: "quantity"; key: string; label: string; unit: QuantityKind; optional?: boolean; hint?: string }
  | { type: "choice"; key: string; label: string; choices: { value: string; label: string }[] }
  | { type: "bus"; key: string; label: string; terminal: TerminalId };

export const elementSchemas: Record<ElementKind, z.ZodType> = {
  bus: busSchema,
  source: sourceSchema,
  transformer: transformerSchema,
  line: lineSchema,
  load: loadSchema,
  shunt: shuntSchema,
};

const name: FieldDef = { type: "text", key: "name", label: "Name" };

/** A quantity field labelled and unit-ed as the field catalogue says. */
function quantity(key: CatalogueKey, options: { optional?: boolean; hint?: string; label?: string } = {}): FieldDef {
  const entry: CatalogueField = FIELD_CATALOGUE[key];
  return { type: "quantity", key, label: options.label ?? entry.label, unit: entry.quantity!, optional: options.optional, hint: options.hint };
}

export function fieldsFor(kind: ElementKind, element: AnyElement): FieldDef[] {
  switch (kind) {
    case "bus":
      return [
        name,
        quantity("nominalKV"),
        quantity("vMinPu"),
        quantity("vMaxPu"),
        quantity("breakingKA", { optional: true }),
        quantity("minFaultMVA", { optional: true, hint: "a grid-connection requirement; checked against the IEC 60909-0 minimum case" }),
      ];
    case "source":
      return sourceFields(element as Source);
    case "transformer":
      return [
        name,
        { type: "bus", key: "hvBus", label: "HV busbar", terminal: "hv" },
        { type: "bus", key: "lvBus", label: "LV busbar", terminal: "lv" },
        quantity("ratedMVA"),
        quantity("hvKV"),
        quantity("lvKV"),
        quantity("impedancePct"),
        quantity("xOverR", { optional: true, hint: "used when the load loss is not given" }),
        quantity("loadLossKW", { optional: true }),
        quantity("noLoadLossKW", { optional: true }),
        quantity("tapPct", { hint: "+2.5 % means 2.5 % more HV turns" }),
        quantity("tapMinPct", { optional: true }),
        quantity("tapMaxPct", { optional: true }),
        quantity("tapStepPct", { optional: true }),
        { type: "text", key: "vectorGroup", label: "Vector group" },
        quantity("z0OverZ1", { optional: true }),
      ];
    case "line":
      return [
        name,
        {
          type: "choice",
          key: "kind",
          label: "Construction",
          choices: [
            { value: "overhead", label: "Overhead line" },
            { value: "cable", label: "Cable" },
          ],
        },
        { type: "bus", key: "fromBus", label: "From busbar", terminal: "from" },
        { type: "bus", key: "toBus", label: "To busbar", terminal: "to" },
        quantity("lengthKm"),
        quantity("rOhmPerKm"),
        quantity("xOhmPerKm"),
        quantity("bMicroSiemensPerKm", { optional: true }),
        quantity("ampacityA", { optional: true }),
        quantity("r0OhmPerKm", { optional: true, hint: "3 × r when empty" }),
        quantity("x0OhmPerKm", { optional: true, hint: "3 × x when empty" }),
      ];
    case "load":
      return [
        name,
        { type: "bus", key: "bus", label: "Busbar", terminal: "t" },
        quantity("pMW"),
        quantity("qMvar"),
        {
          type: "choice",
          key: "model",
          label: "Voltage dependence",
          choices: [
            { value: "constant-power", label: "Constant power" },
            { value: "constant-current", label: "Constant current" },
            { value: "constant-impedance", label: "Constant impedance" },
          ],
        },
      ];
    case "shunt":
      return [
        name,
        { type: "bus", key: "bus", label: "Busbar", terminal: "t" },
        quantity("qMvar", { label: "Reactive power at 1 pu", hint: "positive for a capacitor" }),
      ];
  }
}

function sourceFields(source: Source): FieldDef[] {
  const fields: FieldDef[] = [
    name,
    { type: "bus", key: "bus", label: "Busbar", terminal: "t" },
    {
      type: "choice",
      key: "kind",
      label: "Kind",
      choices: [
        { value: "grid", label: "Grid infeed" },
        { value: "generator", label: "Generator" },
        { value: "converter", label: "Converter plant (solar, wind, battery)" },
      ],
    },
    {
      type: "choice",
      key: "control",
      label: "Control",
      choices: [
        { value: "slack", label: "Slack: holds voltage and angle" },
        { value: "pv", label: "PV: holds P and voltage" },
        { value: "pq", label: "PQ: fixed P and Q" },
        ...(source.kind === "converter" ? [{ value: "pf", label: "PF: P at a set power factor" }] : []),
      ],
    },
  ];
  if (source.control !== "pq" && source.control !== "pf") fields.push(quantity("voltagePu"));
  if (source.control === "slack") fields.push(quantity("angleDeg"));
  if (source.control !== "slack") fields.push(quantity("pMW"));
  if (source.control === "pq") fields.push(quantity("qMvar"));
  if (source.control === "pf") fields.push(quantity("powerFactor"));
  if (source.control === "pv")
    fields.push(
      quantity("qMinMvar", { optional: true }),
      quantity("qMaxMvar", { optional: true }),
    );
  if (source.kind === "grid")
    fields.push(
      quantity("shortCircuitMVA"),
      quantity("shortCircuitMinMVA", { optional: true, hint: "for minimum fault levels; the maximum when empty" }),
      quantity("xOverR", { optional: true }),
      quantity("z0OverZ1", { optional: true }),
    );
  else if (source.kind === "converter")
    fields.push(
      quantity("ratedMVA"),
      quantity("faultCurrentPct", { hint: "the maker's stated maximum (IEC 60909-0:2016 full-converter unit)" }),
      quantity("minShortCircuitRatio", {
        optional: true,
        hint: "S″k3 min / rated MVA the connection must keep; 3 when empty (common practice), or what the grid code or the maker asks",
      }),
    );
  else
    fields.push(
      quantity("ratedMVA"),
      quantity("ratedKV", { optional: true }),
      quantity("xdSubtransientPct"),
      quantity("xOverR", { optional: true }),
      quantity("ratedPowerFactor", { optional: true }),
    );
  return fields;
}

export type FieldCheck = { ok: true; element: AnyElement } | { ok: false; message: string };

/**
 * Check one field's new value with the element's own schema. Problems elsewhere in the element
 * (a terminal not yet connected) do not block this field.
 */
export function checkField(kind: ElementKind, element: AnyElement, key: string, value: unknown): FieldCheck {
  const candidate: Record<string, unknown> = { ...element };
  if (value === undefined) delete candidate[key];
  else candidate[key] = value;
  const parsed = elementSchemas[kind].safeParse(candidate);
  if (parsed.success) {
    const cleaned = (parsed.data as Record<string, unknown>)[key];
    return { ok: true, element: { ...candidate, ...(value === undefined ? {} : { [key]: cleaned }) } as AnyElement };
  }
  const here = parsed.error.issues.find((issue) => issue.path[0] === key);
  if (here) return { ok: false, message: plainFieldMessage(here) };
  return { ok: true, element: candidate as unknown as AnyElement };
}

/** zod's messages in a planner's words, for the limits a field can break. */
function plainFieldMessage(issue: z.core.$ZodIssue): string {
  if (issue.code === "too_small" && issue.origin === "number")
    return issue.inclusive ? `must be ${issue.minimum} or more` : `must be more than ${issue.minimum}`;
  if (issue.code === "too_big" && issue.origin === "number")
    return issue.inclusive ? `must be ${issue.maximum} or less` : `must be less than ${issue.maximum}`;
  if (issue.code === "invalid_type") return "is required";
  if (issue.code === "invalid_value") return `must be one of ${issue.values.map(String).join(", ")}`;
  return issue.message;
}
