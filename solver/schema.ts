// The network file: the contract between the editor, the API, the solver and every outside check.
// One zod schema validates shape (unknown fields rejected), then `networkRules` checks what a
// shape cannot: references, unique ids, one slack per connected group, voltage levels.
import { z } from "zod";
import { networkRules, POWER_LIMIT, vectorGroupPattern } from "#solver/networkRules.ts";
import { formatPath, validateDocument } from "#solver/validation/document.ts";
import { typeMessage } from "#solver/validation/read.ts";

export { HOURS_PER_LEAP_YEAR, vectorGroupPattern, WINDING_TOLERANCE } from "#solver/networkRules.ts";
export { formatPath } from "#solver/validation/document.ts";

const finite = z.number().finite();
const id = z.string().trim().min(1, "must not be empty").max(100);
const name = z.string().trim().min(1, "must not be empty").max(200);

/**
 * A number within the range that equipment on a power network can have. The bounds are wide (a
 * planner never meets them) and exist so that a typing slip such as 1e300 MVA is named at its path
 * instead of turning the per-unit model into overflow or a singular matrix.
 */
function within(min: number, max: number, unit: string, options: { minExclusive?: boolean } = {}) {
  const label = unit ? ` ${unit}` : "";
  const base = options.minExclusive
    ? finite.gt(min, `must be above ${min}${label}`)
    : finite.gte(min, `must be at least ${min}${label}`);
  return base.lte(max, `must be at most ${max}${label}`);
}

const kV = within(0.05, 1500, "kV");
const MVA = within(1e-4, 1e5, "MVA");
const signedMW = within(-POWER_LIMIT, POWER_LIMIT, "MW");
const signedMvar = within(-POWER_LIMIT, POWER_LIMIT, "Mvar");
const voltagePu = within(0.5, 1.5, "pu");
const ratio = within(1e-3, 1e3, "");
// X/R may be very large: a textbook check models an ideal reactance that way.
const xOverR = within(1e-3, 1e12, "");
const percentTap = within(-50, 50, "%");

export const busSchema = z.strictObject({
  id,
  name,
  nominalKV: kV,
  vMinPu: voltagePu.default(0.95),
  vMaxPu: voltagePu.default(1.05),
  breakingKA: within(0, 1000, "kA", { minExclusive: true }).optional(),
  /** Version 2: the minimum S"k3min the planner asks of this bus (a grid-connection requirement). */
  minFaultMVA: within(1e-3, 1e7, "MVA").optional(),
  x: finite.optional(),
  y: finite.optional(),
});

export const sourceSchema = z.strictObject({
  id,
  name,
  bus: id,
  /** "converter" (version 2): a plant connected through power electronics, an IEC 60909-0:2016 full-converter unit. */
  kind: z.enum(["grid", "generator", "converter"]),
  /** "pf" (version 2, converters): pMW at powerFactor. */
  control: z.enum(["slack", "pv", "pq", "pf"]),
  voltagePu: voltagePu.default(1.0),
  angleDeg: within(-180, 180, "degrees").default(0),
  pMW: signedMW.default(0),
  qMvar: signedMvar.default(0),
  qMinMvar: signedMvar.optional(),
  qMaxMvar: signedMvar.optional(),
  shortCircuitMVA: within(1e-3, 1e7, "MVA").optional(),
  /** Version 2, grid: the weakest infeed, for minimum fault levels. */
  shortCircuitMinMVA: within(1e-3, 1e7, "MVA").optional(),
  xOverR: xOverR.optional(),
  z0OverZ1: ratio.optional(),
  ratedMVA: MVA.optional(),
  ratedKV: kV.optional(),
  xdSubtransientPct: within(1, 1000, "%").optional(),
  ratedPowerFactor: within(0, 1, "", { minExclusive: true }).optional(),
  /** Version 2, converter with control "pf": + supplies reactive power, − absorbs it. */
  powerFactor: within(-1, 1, "").optional(),
  /** Version 2, converter: maximum short-circuit current I_skPF as a percentage of rated current. */
  faultCurrentPct: within(0, 1000, "%").optional(),
  /** Version 2, converter: the lowest short-circuit ratio the planner accepts at its bus (3 when not given). */
  minShortCircuitRatio: within(0.1, 100, "").optional(),
});

export const transformerSchema = z.strictObject({
  id,
  name,
  hvBus: id,
  lvBus: id,
  ratedMVA: MVA,
  hvKV: kV,
  lvKV: kV,
  impedancePct: within(0.1, 100, "%"),
  xOverR: xOverR.optional(),
  loadLossKW: within(0, 1e6, "kW").optional(),
  noLoadLossKW: within(0, 1e6, "kW").optional(),
  tapPct: percentTap.default(0),
  tapMinPct: percentTap.optional(),
  tapMaxPct: percentTap.optional(),
  tapStepPct: within(0, 50, "%", { minExclusive: true }).optional(),
  vectorGroup: z
    .string()
    .regex(vectorGroupPattern, "must be an IEC 60076-1 vector group such as YNd11, Dyn11 or YNyn0"),
  z0OverZ1: ratio.optional(),
  /** Version 2: an on-load tap changer holding |V| of `bus` within targetPu ± bandPu/2. */
  tapControl: z
    .strictObject({
      bus: id,
      targetPu: voltagePu,
      bandPu: within(0.001, 0.5, "pu"),
    })
    .optional(),
});

export const lineSchema = z.strictObject({
  id,
  name,
  fromBus: id,
  toBus: id,
  kind: z.enum(["overhead", "cable"]),
  lengthKm: within(1e-3, 1e4, "km"),
  rOhmPerKm: within(0, 1e3, "ohm/km"),
  xOhmPerKm: within(0, 1e3, "ohm/km"),
  bMicroSiemensPerKm: within(0, 1e5, "µS/km").optional(),
  r0OhmPerKm: within(0, 1e4, "ohm/km").optional(),
  x0OhmPerKm: within(0, 1e4, "ohm/km").optional(),
  ampacityA: within(0, 1e5, "A", { minExclusive: true }).optional(),
});

export const loadSchema = z.strictObject({
  id,
  name,
  bus: id,
  pMW: signedMW,
  qMvar: signedMvar.default(0),
  model: z.enum(["constant-power", "constant-current", "constant-impedance"]).default("constant-power"),
});

export const shuntSchema = z.strictObject({
  id,
  name,
  bus: id,
  qMvar: signedMvar,
});

/** A source's dispatch in one operating case; what is not given stays as drawn. */
export const caseSourceSchema = z.strictObject({
  pMW: signedMW.optional(),
  qMvar: signedMvar.optional(),
  voltagePu: voltagePu.optional(),
  inService: z.boolean().optional(),
});

const loadFactor = within(0, 100, "");

/** One operating case (version 2): load scales, dispatch and outages, and the hours it stands for. */
export const operatingCaseSchema = z.strictObject({
  id,
  name,
  // 8784 h is a leap year; a case's hours are the part of the year the network spends there.
  hoursPerYear: within(0, 8784, "h").optional(),
  loadScale: loadFactor.default(1),
  loads: z.record(z.string(), loadFactor).optional(),
  sources: z.record(z.string(), caseSourceSchema).optional(),
  outOfService: z.array(id).optional(),
});

/** Load growth for the years study (version 2). */
export const growthSchema = z.strictObject({
  ratePctPerYear: within(-50, 100, "%"),
  years: z.number().int("must be a whole number of years").min(1, "must be at least 1 year").max(100, "must be at most 100 years"),
});

const networkShape = z.strictObject({
  format: z.literal("kilostep.network"),
  version: z.union([z.literal(1), z.literal(2)]),
  name,
  frequencyHz: z.union([z.literal(50), z.literal(60)]),
  baseMVA: within(1, 1e5, "MVA").default(100),
  buses: z.array(busSchema).min(1, "a network needs at least one bus"),
  sources: z.array(sourceSchema).default([]),
  transformers: z.array(transformerSchema).default([]),
  lines: z.array(lineSchema).default([]),
  loads: z.array(loadSchema).default([]),
  shunts: z.array(shuntSchema).default([]),
  cases: z.array(operatingCaseSchema).max(100, "at most 100 operating cases").optional(),
  growth: growthSchema.optional(),
});

export type Network = z.output<typeof networkShape>;
export type NetworkInput = z.input<typeof networkShape>;
export type Bus = Network["buses"][number];
export type Source = Network["sources"][number];
export type Transformer = Network["transformers"][number];
export type Line = Network["lines"][number];
export type Load = Network["loads"][number];
export type Shunt = Network["shunts"][number];
export type OperatingCase = NonNullable<Network["cases"]>[number];
export type CaseSource = z.output<typeof caseSourceSchema>;
export type Growth = NonNullable<Network["growth"]>;

export interface ValidationIssue {
  /** Where the problem is, e.g. `transformers[0].hvKV`; empty for the document itself. */
  path: string;
  message: string;
}

export const networkSchema = networkShape.superRefine((net, ctx) =>
  networkRules(net, (path, message) => ctx.addIssue({ code: "custom", path, message })),
);

/**
 * A draft: the drawing as a planner leaves it. The shape is the file's own (types, bounds, no
 * unknown fields), except that a terminal may be connected to nothing yet (an empty bus
 * reference); the cross-element rules become the draft's problems instead of refusing it.
 */
const unconnected = z.string().trim().max(100);
const draftShape = networkShape.extend({
  sources: z.array(sourceSchema.extend({ bus: unconnected })).default([]),
  transformers: z.array(transformerSchema.extend({ hvBus: unconnected, lvBus: unconnected })).default([]),
  lines: z.array(lineSchema.extend({ fromBus: unconnected, toBus: unconnected })).default([]),
  loads: z.array(loadSchema.extend({ bus: unconnected })).default([]),
  shunts: z.array(shuntSchema.extend({ bus: unconnected })).default([]),
});

/** Messages in a planner's words for the shape errors zod reports in its own. */
function plainMessage(issue: z.core.$ZodRawIssue): string | undefined {
  switch (issue.code) {
    case "unrecognized_keys":
      return `unknown field${issue.keys.length > 1 ? "s" : ""} ${issue.keys.map((k) => `"${k}"`).join(", ")}`;
    case "invalid_type":
      return typeMessage(issue.expected, issue.input);
    default:
      return undefined;
  }
}

export type ValidationResult =
  | { ok: true; network: Network }
  | { ok: false; issues: ValidationIssue[] };

/**
 * Validate an untrusted document; every problem comes back with its path, none thrown. The
 * single-pass validator of `validation/document.ts` does the work; it gives what the zod schema
 * below would, an order of magnitude faster.
 */
export function validateNetwork(input: unknown): ValidationResult {
  return validateDocument(input);
}

/** The same answer from the zod schema itself: the reference the single-pass validator is tested against. */
export function validateNetworkWithSchema(input: unknown): ValidationResult {
  const parsed = networkSchema.safeParse(input, { error: plainMessage });
  if (parsed.success) return { ok: true, network: parsed.data };
  return {
    ok: false,
    issues: parsed.error.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message })),
  };
}

export type DraftValidationResult =
  | { ok: true; network: Network; problems: ValidationIssue[] }
  | { ok: false; issues: ValidationIssue[] };

/**
 * Validate a draft: its shape must hold (else `ok: false`, as for a file); what the cross-element
 * rules find comes back as `problems`, empty for a complete network.
 */
export function validateDraft(input: unknown): DraftValidationResult {
  const complete = validateNetwork(input);
  if (complete.ok) return { ok: true, network: complete.network, problems: [] };
  const shaped = draftShape.safeParse(input, { error: plainMessage });
  if (!shaped.success) {
    return { ok: false, issues: shaped.error.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message })) };
  }
  const problems: ValidationIssue[] = [];
  networkRules(shaped.data as Network, (path, message) => problems.push({ path: formatPath(path), message }));
  return { ok: true, network: shaped.data as Network, problems };
}

/** JSON Schema of the network file (input side: optional fields with defaults stay optional). */
export function networkJsonSchema(): object {
  return z.toJSONSchema(networkShape, { io: "input", target: "draft-2020-12" });
}
