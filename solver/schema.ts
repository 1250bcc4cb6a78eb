// The network file: the contract between the editor, the API, the solver and every outside check.
// One zod schema validates shape (unknown fields rejected), then `networkRules` checks what a
// shape cannot: references, unique ids, one slack per connected group, voltage levels.
import { z } from "zod";

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
const signedMW = within(-1e5, 1e5, "MW");
const signedMvar = within(-1e5, 1e5, "Mvar");
const voltagePu = within(0.5, 1.5, "pu");
const ratio = within(1e-3, 1e3, "");
// X/R may be very large: a textbook check models an ideal reactance that way.
const xOverR = within(1e-3, 1e12, "");
const percentTap = within(-50, 50, "%");

/** IEC 60076-1 vector group: HV letters, LV letters, clock number 0–11 (e.g. YNd11, Dyn11, YNyn0). */
export const vectorGroupPattern = /^(YN|Y|D|ZN|Z)(yn|y|d|zn|z)(\d{1,2})$/;

export const busSchema = z.strictObject({
  id,
  name,
  nominalKV: kV,
  vMinPu: voltagePu.default(0.95),
  vMaxPu: voltagePu.default(1.05),
  breakingKA: within(0, 1000, "kA", { minExclusive: true }).optional(),
  x: finite.optional(),
  y: finite.optional(),
});

export const sourceSchema = z.strictObject({
  id,
  name,
  bus: id,
  kind: z.enum(["grid", "generator"]),
  control: z.enum(["slack", "pv", "pq"]),
  voltagePu: voltagePu.default(1.0),
  angleDeg: within(-180, 180, "degrees").default(0),
  pMW: signedMW.default(0),
  qMvar: signedMvar.default(0),
  qMinMvar: signedMvar.optional(),
  qMaxMvar: signedMvar.optional(),
  shortCircuitMVA: within(1e-3, 1e7, "MVA").optional(),
  xOverR: xOverR.optional(),
  z0OverZ1: ratio.optional(),
  ratedMVA: MVA.optional(),
  ratedKV: kV.optional(),
  xdSubtransientPct: within(1, 1000, "%").optional(),
  ratedPowerFactor: within(0, 1, "", { minExclusive: true }).optional(),
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

/** Transformer winding voltages may differ from the bus nominal by this much (an off-nominal ratio). */
export const WINDING_TOLERANCE = 0.15;

function label(kind: string, element: { id: string; name: string }): string {
  return `${kind} "${element.name}" (${element.id})`;
}

/** Cross-element rules a shape cannot express; every issue names the element and its path. */
function networkRules(net: Network, ctx: z.RefinementCtx): void {
  const add = (path: (string | number)[], message: string) =>
    ctx.addIssue({ code: "custom", path, message });

  const seen = new Map<string, string>();
  const collections = ["buses", "sources", "transformers", "lines", "loads", "shunts"] as const;
  for (const key of collections) {
    net[key].forEach((element, i) => {
      const first = seen.get(element.id);
      if (first) add([key, i, "id"], `id "${element.id}" is already used by ${first}`);
      else seen.set(element.id, `${key}[${i}]`);
    });
  }

  const busById = new Map(net.buses.map((b) => [b.id, b]));
  const busRef = (path: (string | number)[], busId: string, owner: string) => {
    const bus = busById.get(busId);
    if (!bus) add(path, `${owner} refers to bus "${busId}", which does not exist`);
    return bus;
  };

  net.buses.forEach((b, i) => {
    if (b.vMinPu >= b.vMaxPu)
      add(["buses", i, "vMinPu"], `${label("Bus", b)}: vMinPu ${b.vMinPu} must be below vMaxPu ${b.vMaxPu}`);
  });

  net.sources.forEach((s, i) => {
    const who = label("Source", s);
    busRef(["sources", i, "bus"], s.bus, who);
    if (s.kind === "grid" && s.shortCircuitMVA === undefined)
      add(["sources", i, "shortCircuitMVA"], `${who}: a grid infeed needs its short-circuit power shortCircuitMVA`);
    if (s.kind === "generator") {
      if (s.ratedMVA === undefined) add(["sources", i, "ratedMVA"], `${who}: a generator needs ratedMVA`);
      if (s.xdSubtransientPct === undefined)
        add(["sources", i, "xdSubtransientPct"], `${who}: a generator needs its subtransient reactance xdSubtransientPct`);
    }
    if (s.qMinMvar !== undefined && s.qMaxMvar !== undefined && s.qMinMvar > s.qMaxMvar)
      add(["sources", i, "qMinMvar"], `${who}: qMinMvar ${s.qMinMvar} is above qMaxMvar ${s.qMaxMvar}`);
  });

  net.transformers.forEach((t, i) => {
    const who = label("Transformer", t);
    const hv = busRef(["transformers", i, "hvBus"], t.hvBus, who);
    const lv = busRef(["transformers", i, "lvBus"], t.lvBus, who);
    if (t.hvBus === t.lvBus) add(["transformers", i, "lvBus"], `${who} connects bus "${t.hvBus}" to itself`);
    if (hv && Math.abs(t.hvKV / hv.nominalKV - 1) > WINDING_TOLERANCE)
      add(
        ["transformers", i, "hvKV"],
        `${who}: HV winding ${t.hvKV} kV is more than 15 % away from bus "${hv.name}" at ${hv.nominalKV} kV`,
      );
    if (lv && Math.abs(t.lvKV / lv.nominalKV - 1) > WINDING_TOLERANCE)
      add(
        ["transformers", i, "lvKV"],
        `${who}: LV winding ${t.lvKV} kV is more than 15 % away from bus "${lv.name}" at ${lv.nominalKV} kV`,
      );
    if (t.loadLossKW === undefined && t.xOverR === undefined)
      add(["transformers", i, "xOverR"], `${who}: give loadLossKW or xOverR so that its resistance is known`);
    if (t.loadLossKW !== undefined && t.loadLossKW / (t.ratedMVA * 1000) >= t.impedancePct / 100)
      add(["transformers", i, "loadLossKW"], `${who}: loadLossKW ${t.loadLossKW} gives a resistance above its impedance ${t.impedancePct} %`);
    if (t.tapMinPct !== undefined && t.tapMaxPct !== undefined && t.tapMinPct > t.tapMaxPct)
      add(["transformers", i, "tapMinPct"], `${who}: tapMinPct ${t.tapMinPct} is above tapMaxPct ${t.tapMaxPct}`);
    if (t.tapPct <= -100) add(["transformers", i, "tapPct"], `${who}: tapPct ${t.tapPct} would leave no HV turns`);
    const group = vectorGroupPattern.exec(t.vectorGroup);
    if (group) {
      const clock = Number(group[3]);
      const hvKind = group[1][0];
      const lvKind = group[2][0].toUpperCase();
      // Star against delta or zigzag shifts by an odd clock number; like windings, and delta
      // against zigzag, by an even one.
      const mixed = hvKind !== lvKind && (hvKind === "Y" || lvKind === "Y");
      if (clock > 11) add(["transformers", i, "vectorGroup"], `${who}: clock number ${clock} must be 0 to 11`);
      else if ((clock % 2 === 1) !== mixed)
        add(["transformers", i, "vectorGroup"], `${who}: ${t.vectorGroup} is not a possible vector group (clock number ${clock} does not fit these windings)`);
    }
  });

  net.lines.forEach((l, i) => {
    const who = label("Line", l);
    const from = busRef(["lines", i, "fromBus"], l.fromBus, who);
    const to = busRef(["lines", i, "toBus"], l.toBus, who);
    if (l.fromBus === l.toBus) add(["lines", i, "toBus"], `${who} connects bus "${l.fromBus}" to itself`);
    if (from && to && Math.abs(from.nominalKV - to.nominalKV) > 1e-9 * from.nominalKV)
      add(
        ["lines", i, "toBus"],
        `${who} joins "${from.name}" at ${from.nominalKV} kV to "${to.name}" at ${to.nominalKV} kV: a line must stay within one voltage level`,
      );
    if (Math.hypot(l.rOhmPerKm, l.xOhmPerKm) * l.lengthKm < 1e-6)
      add(["lines", i, "xOhmPerKm"], `${who}: its impedance is below a micro-ohm; a line needs an impedance (join the buses instead)`);
  });

  net.loads.forEach((ld, i) => busRef(["loads", i, "bus"], ld.bus, label("Load", ld)));
  net.shunts.forEach((sh, i) => busRef(["shunts", i, "bus"], sh.bus, label("Shunt", sh)));

  operatingCaseRules(net, add);

  // One slack per connected group: union-find over branches whose ends both exist, with full path
  // compression and union by size so that a 100,000-bus chain stays linear.
  const parent = new Map(net.buses.map((b) => [b.id, b.id]));
  const size = new Map(net.buses.map((b) => [b.id, 1]));
  const find = (x: string): string => {
    let root = x;
    while (parent.get(root) !== root) root = parent.get(root)!;
    for (let node = x; node !== root; ) {
      const next = parent.get(node)!;
      parent.set(node, root);
      node = next;
    }
    return root;
  };
  const join = (a: string, b: string) => {
    if (!parent.has(a) || !parent.has(b)) return;
    let [ra, rb] = [find(a), find(b)];
    if (ra === rb) return;
    if (size.get(ra)! < size.get(rb)!) [ra, rb] = [rb, ra];
    parent.set(rb, ra);
    size.set(ra, size.get(ra)! + size.get(rb)!);
  };
  net.lines.forEach((l) => join(l.fromBus, l.toBus));
  net.transformers.forEach((t) => join(t.hvBus, t.lvBus));
  const slacks = new Map<string, number[]>();
  net.sources.forEach((s, i) => {
    if (s.control === "slack" && parent.has(s.bus)) {
      const root = find(s.bus);
      slacks.set(root, [...(slacks.get(root) ?? []), i]);
    }
  });
  const reported = new Set<string>();
  net.buses.forEach((b, i) => {
    const root = find(b.id);
    if (reported.has(root)) return;
    reported.add(root);
    const found = slacks.get(root) ?? [];
    if (found.length === 0)
      add(["buses", i], `Bus "${b.name}" (${b.id}) and the buses connected to it have no slack source; each connected group needs exactly one`);
    for (const extra of found.slice(1))
      add(["sources", extra, "control"], `${label("Source", net.sources[extra])} is a second slack in the group of bus "${b.name}"; each connected group needs exactly one`);
  });
}

/** Hours in a leap year: the most the cases together may stand for. */
export const HOURS_PER_LEAP_YEAR = 8784;

/** Operating cases name loads, sources and elements that exist, each once; only version 2 has them. */
function operatingCaseRules(net: Network, add: (path: (string | number)[], message: string) => void): void {
  if (net.version < 2) {
    if (net.cases) add(["cases"], `operating cases need "version": 2`);
    if (net.growth) add(["growth"], `load growth needs "version": 2`);
  }
  const cases = net.cases ?? [];
  const loadIds = new Set(net.loads.map((l) => l.id));
  const sourceIds = new Set(net.sources.map((s) => s.id));
  const switchable = new Set([...net.lines, ...net.transformers, ...net.loads, ...net.shunts, ...net.sources].map((e) => e.id));
  const caseIds = new Map<string, number>();
  let hours = 0;
  cases.forEach((c, i) => {
    const who = `Case "${c.name}" (${c.id})`;
    const first = caseIds.get(c.id);
    if (first !== undefined) add(["cases", i, "id"], `case id "${c.id}" is already used by cases[${first}]`);
    else caseIds.set(c.id, i);
    hours += c.hoursPerYear ?? 0;
    for (const loadId of Object.keys(c.loads ?? {}))
      if (!loadIds.has(loadId)) add(["cases", i, "loads", loadId], `${who} scales load "${loadId}", which does not exist`);
    for (const sourceId of Object.keys(c.sources ?? {}))
      if (!sourceIds.has(sourceId)) add(["cases", i, "sources", sourceId], `${who} sets source "${sourceId}", which does not exist`);
    (c.outOfService ?? []).forEach((elementId, j) => {
      if (!switchable.has(elementId))
        add(["cases", i, "outOfService", j], `${who} takes "${elementId}" out of service, but no line, transformer, load, shunt or source has that id`);
    });
  });
  if (hours > HOURS_PER_LEAP_YEAR)
    add(["cases"], `the cases stand for ${hours} hours together, more than the ${HOURS_PER_LEAP_YEAR} hours of a year`);
}

export const networkSchema = networkShape.superRefine(networkRules);

export function formatPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const part of path) {
    if (typeof part === "number") out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}

/** Messages in a planner's words for the shape errors zod reports in its own. */
function plainMessage(issue: z.core.$ZodRawIssue): string | undefined {
  switch (issue.code) {
    case "unrecognized_keys":
      return `unknown field${issue.keys.length > 1 ? "s" : ""} ${issue.keys.map((k) => `"${k}"`).join(", ")}`;
    case "invalid_type":
      if (issue.input === undefined) return `is required (${issue.expected})`;
      return `must be ${issue.expected === "array" || issue.expected === "object" ? "an" : "a"} ${issue.expected}, not ${describe(issue.input)}`;
    default:
      return undefined;
  }
}

function describe(value: unknown): string {
  if (value === null) return "null";
  if (Array.isArray(value)) return "a list";
  if (typeof value === "string") return `the text "${value.length > 20 ? `${value.slice(0, 20)}…` : value}"`;
  if (typeof value === "number" && !Number.isFinite(value)) return String(value);
  return typeof value;
}

export type ValidationResult =
  | { ok: true; network: Network }
  | { ok: false; issues: ValidationIssue[] };

/** Validate an untrusted document; every problem comes back with its path, none thrown. */
export function validateNetwork(input: unknown): ValidationResult {
  const parsed = networkSchema.safeParse(input, { error: plainMessage });
  if (parsed.success) return { ok: true, network: parsed.data };
  return {
    ok: false,
    issues: parsed.error.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message })),
  };
}

/** JSON Schema of the network file (input side: optional fields with defaults stay optional). */
export function networkJsonSchema(): object {
  return z.toJSONSchema(networkShape, { io: "input", target: "draft-2020-12" });
}
