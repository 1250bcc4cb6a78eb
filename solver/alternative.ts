// One alternative of the voltage ladder: the network with its section re-rated to a candidate voltage.
import { z } from "zod";
import { capitalOverrideSchema } from "#solver/economics.ts";
import {
  busSchema,
  formatPath,
  lineSchema,
  loadSchema,
  shuntSchema,
  sourceSchema,
  transformerSchema,
  validateNetwork,
  type Bus,
  type Line,
  type Load,
  type Network,
  type Shunt,
  type Source,
  type Transformer,
  type ValidationIssue,
} from "#solver/schema.ts";
import type { Section } from "#solver/section.ts";
import { ELEMENT_COLLECTIONS, KIND_OF_COLLECTION } from "#solver/elements.ts";

/**
 * An override may change an element's ratings and parameters but not what it connects to nor
 * its id; a bus keeps the candidate voltage as its nominal voltage, that being the alternative.
 * Defaults are stripped so that an override touches only the fields it names.
 */
function overrideSchema(shape: Record<string, z.ZodType>, fixed: readonly string[]) {
  const fields = Object.entries(shape)
    .filter(([key]) => !fixed.includes(key))
    .map(([key, schema]) => [key, (schema instanceof z.ZodDefault ? (schema.unwrap() as z.ZodType) : schema).optional()]);
  return z.strictObject(Object.fromEntries(fields));
}

type Override<T, Fixed extends keyof T> = Partial<Omit<T, Fixed>>;

const overrides = <T>(schema: z.ZodType) => z.record(z.string(), schema) as unknown as z.ZodType<Record<string, T>>;

/** A conductor type for every line of the section (per-line exceptions go in `lines`). */
export const conductorSchema = z.strictObject({
  name: z.string().trim().min(1, "must not be empty").max(200).optional(),
  rOhmPerKm: lineSchema.shape.rOhmPerKm,
  xOhmPerKm: lineSchema.shape.xOhmPerKm,
  bMicroSiemensPerKm: lineSchema.shape.bMicroSiemensPerKm,
  r0OhmPerKm: lineSchema.shape.r0OhmPerKm,
  x0OhmPerKm: lineSchema.shape.x0OhmPerKm,
  ampacityA: lineSchema.shape.ampacityA,
});
export type Conductor = z.output<typeof conductorSchema>;

/** Everything a planner may set for one alternative beyond its voltage; element maps are keyed by id. */
export const alternativeOverridesSchema = z.strictObject({
  conductor: conductorSchema.optional(),
  buses: overrides<Override<Bus, "id" | "nominalKV">>(overrideSchema(busSchema.shape, ["id", "nominalKV"])).optional(),
  sources: overrides<Override<Source, "id" | "bus">>(overrideSchema(sourceSchema.shape, ["id", "bus"])).optional(),
  transformers: overrides<Override<Transformer, "id" | "hvBus" | "lvBus">>(
    overrideSchema(transformerSchema.shape, ["id", "hvBus", "lvBus"]),
  ).optional(),
  lines: overrides<Override<Line, "id" | "fromBus" | "toBus">>(overrideSchema(lineSchema.shape, ["id", "fromBus", "toBus"])).optional(),
  loads: overrides<Override<Load, "id" | "bus">>(overrideSchema(loadSchema.shape, ["id", "bus"])).optional(),
  shunts: overrides<Override<Shunt, "id" | "bus">>(overrideSchema(shuntSchema.shape, ["id", "bus"])).optional(),
  /** Capital cost entries for this alternative (used by the money, not by the network). */
  capital: capitalOverrideSchema.optional(),
});
export type AlternativeOverrides = z.output<typeof alternativeOverridesSchema>;

const FIXED_FIELDS = ["id", "nominalKV", "bus", "hvBus", "lvBus", "fromBus", "toBus"];

/** Plain-language messages for the shape errors of ladder inputs, naming the field. */
export function inputMessage(issue: z.core.$ZodRawIssue): string | undefined {
  switch (issue.code) {
    case "unrecognized_keys": {
      const fixed = issue.keys.filter((k) => FIXED_FIELDS.includes(k));
      if (fixed.length > 0)
        return `${fixed.map((k) => `"${k}"`).join(", ")} cannot be changed per alternative: ids, connections and the section's voltage stay as drawn`;
      return `${issue.keys.map((k) => `"${k}"`).join(", ")} ${issue.keys.length > 1 ? "are not fields" : "is not a field"} that can be given here`;
    }
    case "invalid_type":
      if (issue.input === undefined) return `is required (${issue.expected})`;
      return `must be ${issue.expected === "array" || issue.expected === "object" ? "an" : "a"} ${issue.expected}`;
    default:
      return undefined;
  }
}

export function zodIssues(error: z.ZodError, prefix: readonly PropertyKey[] = []): ValidationIssue[] {
  return error.issues.map((issue) => ({ path: formatPath([...prefix, ...issue.path]), message: issue.message }));
}

export type DerivedAlternative = { ok: true; network: Network } | { ok: false; issues: ValidationIssue[] };


/**
 * The network with the section at `voltageKV`: its buses' nominal voltage, the windings facing
 * it, the rated voltage of sources on it; breaking currents, tap positions and the other
 * windings kept. Then the conductor, if given, on every section line, and last the per-element
 * overrides. The result is checked by the same validator as any network file.
 */
export function deriveAlternative(
  network: Network,
  section: Section,
  voltageKV: number,
  overridesInput: unknown = {},
): DerivedAlternative {
  if (!Number.isFinite(voltageKV) || voltageKV <= 0)
    return { ok: false, issues: [{ path: "voltageKV", message: `must be a voltage above 0 kV, not ${voltageKV}` }] };
  const parsed = alternativeOverridesSchema.safeParse(overridesInput ?? {}, { error: inputMessage });
  if (!parsed.success) return { ok: false, issues: zodIssues(parsed.error, ["overrides"]) };
  const o = parsed.data;

  const issues: ValidationIssue[] = [];
  for (const key of ELEMENT_COLLECTIONS) {
    const known = new Set(network[key].map((e) => e.id));
    for (const id of Object.keys(o[key] ?? {}))
      if (!known.has(id)) issues.push({ path: formatPath(["overrides", key, id]), message: `there is no ${KIND_OF_COLLECTION[key]} "${id}" in the network` });
  }

  const inSection = new Set(section.busIds);
  const sectionLines = new Set(section.lineIds);
  const hvFacing = new Set(section.facingWindings.filter((w) => w.winding === "hv").map((w) => w.transformerId));
  const lvFacing = new Set(section.facingWindings.filter((w) => w.winding === "lv").map((w) => w.transformerId));

  const renamed = (name: string) => renameVoltage(name, section.nominalKV, voltageKV);
  const buses = network.buses.map((b) => ({
    ...b,
    ...(inSection.has(b.id) ? { nominalKV: voltageKV, name: renamed(b.name) } : {}),
    ...o.buses?.[b.id],
  }));
  const sources = network.sources.map((s) => ({
    ...s,
    ...(inSection.has(s.bus) && s.ratedKV !== undefined ? { ratedKV: voltageKV } : {}),
    ...o.sources?.[s.id],
  }));
  const transformers = network.transformers.map((t) => {
    const rerated = { ...t, ...(hvFacing.has(t.id) ? { hvKV: voltageKV } : {}), ...(lvFacing.has(t.id) ? { lvKV: voltageKV } : {}) };
    if (hvFacing.has(t.id) !== lvFacing.has(t.id) && rerated.hvKV <= rerated.lvKV)
      issues.push({
        path: formatPath(["transformers", network.transformers.indexOf(t)]),
        message: `Transformer "${t.name}" would have its ${hvFacing.has(t.id) ? "HV" : "LV"} winding at ${voltageKV} kV, ${hvFacing.has(t.id) ? "not above" : "not below"} its other winding (${hvFacing.has(t.id) ? t.lvKV : t.hvKV} kV); choose a candidate on the right side of it`,
      });
    return { ...rerated, ...o.transformers?.[t.id] };
  });
  const lines = network.lines.map((l) => {
    const line: Line = { ...l, ...(sectionLines.has(l.id) ? { name: renamed(l.name) } : {}) };
    if (o.conductor && sectionLines.has(l.id)) {
      line.rOhmPerKm = o.conductor.rOhmPerKm;
      line.xOhmPerKm = o.conductor.xOhmPerKm;
      // Susceptance depends mostly on the tower geometry, so it stays unless the type gives it;
      // zero-sequence data and ampacity belong to the old conductor and go with it.
      if (o.conductor.bMicroSiemensPerKm !== undefined) line.bMicroSiemensPerKm = o.conductor.bMicroSiemensPerKm;
      assignOrDrop(line, "r0OhmPerKm", o.conductor.r0OhmPerKm);
      assignOrDrop(line, "x0OhmPerKm", o.conductor.x0OhmPerKm);
      assignOrDrop(line, "ampacityA", o.conductor.ampacityA);
    }
    return { ...line, ...o.lines?.[l.id] };
  });
  const loads = network.loads.map((ld) => ({ ...ld, ...o.loads?.[ld.id] }));
  const shunts = network.shunts.map((sh) => ({ ...sh, ...o.shunts?.[sh.id] }));
  if (issues.length > 0) return { ok: false, issues };

  const validated = validateNetwork({ ...network, buses, sources, transformers, lines, loads, shunts });
  if (!validated.ok)
    return {
      ok: false,
      issues: validated.issues.map((issue) => ({ path: issue.path, message: `at ${voltageKV} kV: ${issue.message}` })),
    };
  return validated;
}

function assignOrDrop<K extends "r0OhmPerKm" | "x0OhmPerKm" | "ampacityA">(line: Line, key: K, value: Line[K] | undefined): void {
  if (value === undefined) delete line[key];
  else line[key] = value;
}

/** "Fell crossing 66 kV" becomes "Fell crossing 33 kV" so that tables and the report read true. */
export function renameVoltage(name: string, presentKV: number, voltageKV: number): string {
  const present = String(presentKV).replace(".", "\\.");
  return name.replace(new RegExp(`(^|[^\\d.])${present}(\\s?kV\\b)`, "g"), `$1${voltageKV}$2`);
}
