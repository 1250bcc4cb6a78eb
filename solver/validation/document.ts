// The single-pass validator of the network file: one walk over the document that checks its shape
// and builds the output (defaults filled in, texts trimmed), then the cross-element rules of
// `networkRules.ts` when no type error stopped them. It mirrors the zod schema in `schema.ts` field
// for field, with the same messages and paths, and is linear in the size of the document; zod stays
// for the published JSON Schema and the forms. A field added to the schema is added here too: the
// agreement test (tests/unit/solver/validation) feeds both valid and broken documents to both.
import type { Network, ValidationIssue, ValidationResult } from "#solver/schema.ts";
import { networkRules, POWER_LIMIT, vectorGroupPattern } from "#solver/networkRules.ts";
import {
  boolean,
  list,
  literal,
  number,
  object,
  oneOf,
  optional,
  Reader,
  record,
  text,
  typeMessage,
  wholeNumber,
  withDefault,
  type FieldReader,
} from "#solver/validation/read.ts";

const id = text(100);
const name = text(200);
const finite = number();
const kV = number(0.05, 1500, "kV");
const MVA = number(1e-4, 1e5, "MVA");
const signedMW = number(-POWER_LIMIT, POWER_LIMIT, "MW");
const signedMvar = number(-POWER_LIMIT, POWER_LIMIT, "Mvar");
const voltagePu = number(0.5, 1.5, "pu");
const ratio = number(1e-3, 1e3, "");
const xOverR = number(1e-3, 1e12, "");
const percentTap = number(-50, 50, "%");
const vectorGroupMessage = "must be an IEC 60076-1 vector group such as YNd11, Dyn11 or YNyn0";

const vectorGroup: FieldReader = (reader, key, value) => {
  if (typeof value !== "string") reader.fail(key, typeMessage("string", value), true);
  else if (!vectorGroupPattern.test(value)) reader.fail(key, vectorGroupMessage, false);
  return value;
};

const bus = object({
  id,
  name,
  nominalKV: kV,
  vMinPu: withDefault(voltagePu, 0.95),
  vMaxPu: withDefault(voltagePu, 1.05),
  breakingKA: optional(number(0, 1000, "kA", { minExclusive: true })),
  minFaultMVA: optional(number(1e-3, 1e7, "MVA")),
  x: optional(finite),
  y: optional(finite),
});

const source = object({
  id,
  name,
  bus: id,
  kind: oneOf(["grid", "generator", "converter"]),
  control: oneOf(["slack", "pv", "pq", "pf"]),
  voltagePu: withDefault(voltagePu, 1.0),
  angleDeg: withDefault(number(-180, 180, "degrees"), 0),
  pMW: withDefault(signedMW, 0),
  qMvar: withDefault(signedMvar, 0),
  qMinMvar: optional(signedMvar),
  qMaxMvar: optional(signedMvar),
  shortCircuitMVA: optional(number(1e-3, 1e7, "MVA")),
  shortCircuitMinMVA: optional(number(1e-3, 1e7, "MVA")),
  xOverR: optional(xOverR),
  z0OverZ1: optional(ratio),
  ratedMVA: optional(MVA),
  ratedKV: optional(kV),
  xdSubtransientPct: optional(number(1, 1000, "%")),
  ratedPowerFactor: optional(number(0, 1, "", { minExclusive: true })),
  powerFactor: optional(number(-1, 1, "")),
  faultCurrentPct: optional(number(0, 1000, "%")),
  minShortCircuitRatio: optional(number(0.1, 100, "")),
});

const tapControl = object({
  bus: id,
  targetPu: voltagePu,
  bandPu: number(0.001, 0.5, "pu"),
});

const transformer = object({
  id,
  name,
  hvBus: id,
  lvBus: id,
  ratedMVA: MVA,
  hvKV: kV,
  lvKV: kV,
  impedancePct: number(0.1, 100, "%"),
  xOverR: optional(xOverR),
  loadLossKW: optional(number(0, 1e6, "kW")),
  noLoadLossKW: optional(number(0, 1e6, "kW")),
  tapPct: withDefault(percentTap, 0),
  tapMinPct: optional(percentTap),
  tapMaxPct: optional(percentTap),
  tapStepPct: optional(number(0, 50, "%", { minExclusive: true })),
  vectorGroup,
  z0OverZ1: optional(ratio),
  tapControl: optional(tapControl),
});

const line = object({
  id,
  name,
  fromBus: id,
  toBus: id,
  kind: oneOf(["overhead", "cable"]),
  lengthKm: number(1e-3, 1e4, "km"),
  rOhmPerKm: number(0, 1e3, "ohm/km"),
  xOhmPerKm: number(0, 1e3, "ohm/km"),
  bMicroSiemensPerKm: optional(number(0, 1e5, "µS/km")),
  r0OhmPerKm: optional(number(0, 1e4, "ohm/km")),
  x0OhmPerKm: optional(number(0, 1e4, "ohm/km")),
  ampacityA: optional(number(0, 1e5, "A", { minExclusive: true })),
});

const load = object({
  id,
  name,
  bus: id,
  pMW: signedMW,
  qMvar: withDefault(signedMvar, 0),
  model: withDefault(oneOf(["constant-power", "constant-current", "constant-impedance"]), "constant-power"),
});

const shunt = object({ id, name, bus: id, qMvar: signedMvar });

const caseSource = object({
  pMW: optional(signedMW),
  qMvar: optional(signedMvar),
  voltagePu: optional(voltagePu),
  inService: optional(boolean),
});

const loadFactor = number(0, 100, "");

const operatingCase = object({
  id,
  name,
  hoursPerYear: optional(number(0, 8784, "h")),
  loadScale: withDefault(loadFactor, 1),
  loads: optional(record(loadFactor)),
  sources: optional(record(caseSource)),
  outOfService: optional(list(id)),
});

const growth = object({
  ratePctPerYear: number(-50, 100, "%"),
  years: wholeNumber(1, 100, "must be a whole number of years", "must be at least 1 year", "must be at most 100 years"),
});

const network = object({
  format: literal(["kilostep.network"]),
  version: literal([1, 2]),
  name,
  frequencyHz: literal([50, 60]),
  baseMVA: withDefault(number(1, 1e5, "MVA"), 100),
  buses: list(bus, { min: 1, minMessage: "a network needs at least one bus" }),
  sources: withDefault(list(source), []),
  transformers: withDefault(list(transformer), []),
  lines: withDefault(list(line), []),
  loads: withDefault(list(load), []),
  shunts: withDefault(list(shunt), []),
  cases: optional(list(operatingCase, { max: 100, maxMessage: "at most 100 operating cases" })),
  growth: optional(growth),
});

/** `schema.ts`'s path notation: `buses[3].nominalKV`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const part of path) {
    if (typeof part === "number") out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}

/** Validate an untrusted document in one pass; every problem comes back with its path, none thrown. */
export function validateDocument(input: unknown): ValidationResult {
  const reader = new Reader();
  const output = network(reader, undefined, input) as Network;
  if (!reader.aborted) networkRules(output, (path, message) => reader.issues.push({ path, message }));
  if (reader.issues.length === 0) return { ok: true, network: output };
  const issues: ValidationIssue[] = reader.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message }));
  return { ok: false, issues };
}
