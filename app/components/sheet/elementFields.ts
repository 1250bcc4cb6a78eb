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

export function fieldsFor(kind: ElementKind, element: AnyElement): FieldDef[] {
  switch (kind) {
    case "bus":
      return [
        name,
        { type: "quantity", key: "nominalKV", label: "Nominal voltage", unit: "kV" },
        { type: "quantity", key: "vMinPu", label: "Lowest voltage allowed", unit: "pu" },
        { type: "quantity", key: "vMaxPu", label: "Highest voltage allowed", unit: "pu" },
        { type: "quantity", key: "breakingKA", label: "Switchgear breaking current", unit: "kA", optional: true },
      ];
    case "source":
      return sourceFields(element as Source);
    case "transformer":
      return [
        name,
        { type: "bus", key: "hvBus", label: "HV busbar", terminal: "hv" },
        { type: "bus", key: "lvBus", label: "LV busbar", terminal: "lv" },
        { type: "quantity", key: "ratedMVA", label: "Rated power", unit: "MVA" },
        { type: "quantity", key: "hvKV", label: "HV winding", unit: "kV" },
        { type: "quantity", key: "lvKV", label: "LV winding", unit: "kV" },
        { type: "quantity", key: "impedancePct", label: "Short-circuit impedance u_k", unit: "pct" },
        { type: "quantity", key: "xOverR", label: "X/R", unit: "ratio", optional: true, hint: "used when the load loss is not given" },
        { type: "quantity", key: "loadLossKW", label: "Load (copper) loss at rated current", unit: "kW", optional: true },
        { type: "quantity", key: "noLoadLossKW", label: "No-load (core) loss", unit: "kW", optional: true },
        { type: "quantity", key: "tapPct", label: "Tap (HV winding)", unit: "pct", hint: "+2.5 % means 2.5 % more HV turns" },
        { type: "quantity", key: "tapMinPct", label: "Lowest tap", unit: "pct", optional: true },
        { type: "quantity", key: "tapMaxPct", label: "Highest tap", unit: "pct", optional: true },
        { type: "quantity", key: "tapStepPct", label: "Tap step", unit: "pct", optional: true },
        { type: "text", key: "vectorGroup", label: "Vector group" },
        { type: "quantity", key: "z0OverZ1", label: "Z0/Z1", unit: "ratio", optional: true },
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
        { type: "quantity", key: "lengthKm", label: "Length", unit: "km" },
        { type: "quantity", key: "rOhmPerKm", label: "Resistance r", unit: "ohmPerKm" },
        { type: "quantity", key: "xOhmPerKm", label: "Reactance x", unit: "ohmPerKm" },
        { type: "quantity", key: "bMicroSiemensPerKm", label: "Shunt susceptance b", unit: "microSiemensPerKm", optional: true },
        { type: "quantity", key: "ampacityA", label: "Ampacity", unit: "A", optional: true },
        { type: "quantity", key: "r0OhmPerKm", label: "Zero-sequence r0", unit: "ohmPerKm", optional: true, hint: "3 × r when empty" },
        { type: "quantity", key: "x0OhmPerKm", label: "Zero-sequence x0", unit: "ohmPerKm", optional: true, hint: "3 × x when empty" },
      ];
    case "load":
      return [
        name,
        { type: "bus", key: "bus", label: "Busbar", terminal: "t" },
        { type: "quantity", key: "pMW", label: "Active power P", unit: "MW" },
        { type: "quantity", key: "qMvar", label: "Reactive power Q", unit: "Mvar" },
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
        { type: "quantity", key: "qMvar", label: "Reactive power at 1 pu", unit: "Mvar", hint: "positive for a capacitor" },
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
      ],
    },
  ];
  if (source.control !== "pq") fields.push({ type: "quantity", key: "voltagePu", label: "Voltage set point", unit: "pu" });
  if (source.control === "slack") fields.push({ type: "quantity", key: "angleDeg", label: "Angle", unit: "deg" });
  if (source.control !== "slack") fields.push({ type: "quantity", key: "pMW", label: "Active power P", unit: "MW" });
  if (source.control === "pq") fields.push({ type: "quantity", key: "qMvar", label: "Reactive power Q", unit: "Mvar" });
  if (source.control === "pv")
    fields.push(
      { type: "quantity", key: "qMinMvar", label: "Lowest Q", unit: "Mvar", optional: true },
      { type: "quantity", key: "qMaxMvar", label: "Highest Q", unit: "Mvar", optional: true },
    );
  if (source.kind === "grid")
    fields.push(
      { type: "quantity", key: "shortCircuitMVA", label: "Short-circuit power S″kQ", unit: "MVA" },
      { type: "quantity", key: "xOverR", label: "X/R", unit: "ratio", optional: true },
      { type: "quantity", key: "z0OverZ1", label: "Z0/Z1", unit: "ratio", optional: true },
    );
  else
    fields.push(
      { type: "quantity", key: "ratedMVA", label: "Rated power", unit: "MVA" },
      { type: "quantity", key: "ratedKV", label: "Rated voltage", unit: "kV", optional: true },
      { type: "quantity", key: "xdSubtransientPct", label: "Subtransient reactance x″d", unit: "pct" },
      { type: "quantity", key: "xOverR", label: "X/R", unit: "ratio", optional: true },
      { type: "quantity", key: "ratedPowerFactor", label: "Rated power factor", unit: "ratio", optional: true },
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
