// Cross-element rules of the network file, the ones a shape cannot express: unique ids, references,
// one slack per connected group, winding voltages against their buses, lines within one voltage
// level, possible vector groups, operating cases that name what exists. Each issue names the
// element and its path. Run on a document whose shape is already valid.
import { equipmentRules } from "#solver/equipmentRules.ts";
import type { Network } from "#solver/schema.ts";
import { ELEMENT_COLLECTIONS } from "#solver/elements.ts";
import { busIndexOf, IdIndex } from "#solver/idIndex.ts";

/** IEC 60076-1 vector group: HV letters, LV letters, clock number 0–11 (e.g. YNd11, Dyn11, YNyn0). */
export const vectorGroupPattern = /^(YN|Y|D|ZN|Z)(yn|y|d|zn|z)(\d{1,2})$/;

/** The most active or reactive power (either sign) one element may have, in MW or Mvar. */
export const POWER_LIMIT = 1e5;

/** Transformer winding voltages may differ from the bus nominal by this much (an off-nominal ratio). */
export const WINDING_TOLERANCE = 0.15;

function label(kind: string, element: { id: string; name: string }): string {
  return `${kind} "${element.name}" (${element.id})`;
}

type AddIssue = (path: (string | number)[], message: string) => void;

const COLLECTIONS = ELEMENT_COLLECTIONS;

/**
 * Cross-element rules a shape cannot express; every issue names the element and its path. Linear
 * in the size of the network, and a label or path is written only for an issue found.
 */
export function networkRules(net: Network, add: AddIssue): void {
  // Every id of every collection in one index; a repeat is reported at its place, naming the first use.
  const allIds: string[] = [];
  const collectionStart: number[] = [];
  for (const key of COLLECTIONS) {
    collectionStart.push(allIds.length);
    for (const element of net[key]) allIds.push(element.id);
  }
  const placeOf = (at: number): [(typeof COLLECTIONS)[number], number] => {
    let c = COLLECTIONS.length - 1;
    while (collectionStart[c] > at) c--;
    return [COLLECTIONS[c], at - collectionStart[c]];
  };
  const repeats = new IdIndex(allIds).repeats;
  for (let r = 0; r < repeats.length; r += 2) {
    const [key, i] = placeOf(repeats[r]);
    const [firstKey, firstAt] = placeOf(repeats[r + 1]);
    add([key, i, "id"], `id "${allIds[repeats[r]]}" is already used by ${firstKey}[${firstAt}]`);
  }

  const busAt = busPositions(net);
  /** The referenced bus's position, or -1 (reported) when there is none. */
  const busRef = (key: (typeof COLLECTIONS)[number], i: number, field: string, busId: string, kind: string): number => {
    const at = busAt(busId);
    // An empty reference passes only a draft's shape (schema.ts draftShape): a terminal not connected yet.
    if (at === undefined)
      add([key, i, field], busId === "" ? `${label(kind, net[key][i])} is not connected to a bus yet` : `${label(kind, net[key][i])} refers to bus "${busId}", which does not exist`);
    return at ?? -1;
  };
  // Both ends of every branch (lines, then transformers), found once for these rules and the slack rule.
  const lineCount = net.lines.length;
  const branchEnds = new Int32Array(2 * (lineCount + net.transformers.length));

  for (let i = 0; i < net.buses.length; i++) {
    const b = net.buses[i];
    if (b.vMinPu >= b.vMaxPu)
      add(["buses", i, "vMinPu"], `${label("Bus", b)}: vMinPu ${b.vMinPu} must be below vMaxPu ${b.vMaxPu}`);
  }

  for (let i = 0; i < net.sources.length; i++) {
    const s = net.sources[i];
    busRef("sources", i, "bus", s.bus, "Source");
    if (s.kind === "grid" && s.shortCircuitMVA === undefined)
      add(["sources", i, "shortCircuitMVA"], `${label("Source", s)}: a grid infeed needs its short-circuit power shortCircuitMVA`);
    if (s.kind === "generator") {
      if (s.ratedMVA === undefined) add(["sources", i, "ratedMVA"], `${label("Source", s)}: a generator needs ratedMVA`);
      if (s.xdSubtransientPct === undefined)
        add(["sources", i, "xdSubtransientPct"], `${label("Source", s)}: a generator needs its subtransient reactance xdSubtransientPct`);
    }
    if (s.qMinMvar !== undefined && s.qMaxMvar !== undefined && s.qMinMvar > s.qMaxMvar)
      add(["sources", i, "qMinMvar"], `${label("Source", s)}: qMinMvar ${s.qMinMvar} is above qMaxMvar ${s.qMaxMvar}`);
  }

  for (let i = 0; i < net.transformers.length; i++) {
    const t = net.transformers[i];
    const hvAt = busRef("transformers", i, "hvBus", t.hvBus, "Transformer");
    const lvAt = busRef("transformers", i, "lvBus", t.lvBus, "Transformer");
    branchEnds[2 * (lineCount + i)] = hvAt;
    branchEnds[2 * (lineCount + i) + 1] = lvAt;
    const hv = hvAt < 0 ? undefined : net.buses[hvAt];
    const lv = lvAt < 0 ? undefined : net.buses[lvAt];
    if (t.hvBus === t.lvBus) add(["transformers", i, "lvBus"], `${label("Transformer", t)} connects bus "${t.hvBus}" to itself`);
    if (hv && Math.abs(t.hvKV / hv.nominalKV - 1) > WINDING_TOLERANCE)
      add(
        ["transformers", i, "hvKV"],
        `${label("Transformer", t)}: HV winding ${t.hvKV} kV is more than 15 % away from bus "${hv.name}" at ${hv.nominalKV} kV`,
      );
    if (lv && Math.abs(t.lvKV / lv.nominalKV - 1) > WINDING_TOLERANCE)
      add(
        ["transformers", i, "lvKV"],
        `${label("Transformer", t)}: LV winding ${t.lvKV} kV is more than 15 % away from bus "${lv.name}" at ${lv.nominalKV} kV`,
      );
    if (t.loadLossKW === undefined && t.xOverR === undefined)
      add(["transformers", i, "xOverR"], `${label("Transformer", t)}: give loadLossKW or xOverR so that its resistance is known`);
    if (t.loadLossKW !== undefined && t.loadLossKW / (t.ratedMVA * 1000) >= t.impedancePct / 100)
      add(["transformers", i, "loadLossKW"], `${label("Transformer", t)}: loadLossKW ${t.loadLossKW} gives a resistance above its impedance ${t.impedancePct} %`);
    if (t.tapMinPct !== undefined && t.tapMaxPct !== undefined && t.tapMinPct > t.tapMaxPct)
      add(["transformers", i, "tapMinPct"], `${label("Transformer", t)}: tapMinPct ${t.tapMinPct} is above tapMaxPct ${t.tapMaxPct}`);
    if (t.tapPct <= -100) add(["transformers", i, "tapPct"], `${label("Transformer", t)}: tapPct ${t.tapPct} would leave no HV turns`);
    const group = vectorGroupPattern.exec(t.vectorGroup);
    if (group) {
      const clock = Number(group[3]);
      const hvKind = group[1][0];
      const lvKind = group[2][0].toUpperCase();
      // Star against delta or zigzag shifts by an odd clock number; like windings, and delta
      // against zigzag, by an even one.
      const mixed = hvKind !== lvKind && (hvKind === "Y" || lvKind === "Y");
      if (clock > 11) add(["transformers", i, "vectorGroup"], `${label("Transformer", t)}: clock number ${clock} must be 0 to 11`);
      else if ((clock % 2 === 1) !== mixed)
        add(["transformers", i, "vectorGroup"], `${label("Transformer", t)}: ${t.vectorGroup} is not a possible vector group (clock number ${clock} does not fit these windings)`);
    }
  }

  for (let i = 0; i < net.lines.length; i++) {
    const l = net.lines[i];
    const fromAt = busRef("lines", i, "fromBus", l.fromBus, "Line");
    const toAt = busRef("lines", i, "toBus", l.toBus, "Line");
    branchEnds[2 * i] = fromAt;
    branchEnds[2 * i + 1] = toAt;
    const from = fromAt < 0 ? undefined : net.buses[fromAt];
    const to = toAt < 0 ? undefined : net.buses[toAt];
    if (l.fromBus === l.toBus) add(["lines", i, "toBus"], `${label("Line", l)} connects bus "${l.fromBus}" to itself`);
    if (from && to && Math.abs(from.nominalKV - to.nominalKV) > 1e-9 * from.nominalKV)
      add(
        ["lines", i, "toBus"],
        `${label("Line", l)} joins "${from.name}" at ${from.nominalKV} kV to "${to.name}" at ${to.nominalKV} kV: a line must stay within one voltage level`,
      );
    if (Math.hypot(l.rOhmPerKm, l.xOhmPerKm) * l.lengthKm < 1e-6)
      add(["lines", i, "xOhmPerKm"], `${label("Line", l)}: its impedance is below a micro-ohm; a line needs an impedance (join the buses instead)`);
  }

  for (let i = 0; i < net.loads.length; i++) busRef("loads", i, "bus", net.loads[i].bus, "Load");
  for (let i = 0; i < net.shunts.length; i++) busRef("shunts", i, "bus", net.shunts[i].bus, "Shunt");

  operatingCaseRules(net, add);
  equipmentRules(net, add);
  slackRules(net, busAt, branchEnds, add);
}

/**
 * Each bus id's position. A repeated bus id means its last bus, as a lookup table built in order
 * would give; without repeats (every valid network) the shared bus index answers, built here once
 * for the validator's output and used again by the load flow, the faults and the checks.
 */
function busPositions(net: Network): (busId: string) => number | undefined {
  const index = busIndexOf(net);
  if (index.repeats.length === 0) return (busId) => index.get(busId);
  const last = new Map<string, number>();
  for (let i = 0; i < net.buses.length; i++) last.set(net.buses[i].id, i);
  return (busId) => last.get(busId);
}

/**
 * One slack per connected group: union-find over the buses (a repeated id is one node) joined by
 * branches whose ends both exist (`branchEnds`: positions, -1 where missing), with path compression
 * and union by size, so a 100,000-bus chain stays linear. Each group is reported at its first bus.
 */
function slackRules(net: Network, busAt: (busId: string) => number | undefined, branchEnds: Int32Array, add: AddIssue): void {
  const n = net.buses.length;
  const parent = new Int32Array(n);
  const size = new Int32Array(n).fill(1);
  for (let i = 0; i < n; i++) parent[i] = i;
  const find = (x: number): number => {
    let root = x;
    while (parent[root] !== root) root = parent[root];
    while (x !== root) {
      const next = parent[x];
      parent[x] = root;
      x = next;
    }
    return root;
  };
  for (let e = 0; e < branchEnds.length; e += 2) {
    const na = branchEnds[e];
    const nb = branchEnds[e + 1];
    if (na < 0 || nb < 0) continue;
    let ra = find(na);
    let rb = find(nb);
    if (ra === rb) continue;
    if (size[ra] < size[rb]) [ra, rb] = [rb, ra];
    parent[rb] = ra;
    size[ra] += size[rb];
  }
  const slacks = new Map<number, number[]>();
  net.sources.forEach((s, i) => {
    const at = busAt(s.bus);
    if (s.control !== "slack" || at === undefined) return;
    const root = find(at);
    const list = slacks.get(root);
    if (list) list.push(i);
    else slacks.set(root, [i]);
  });
  // Without repeated ids each bus is its own position.
  const repeated = busIndexOf(net).repeats.length > 0;
  const reported = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const b = net.buses[i];
    const root = find(repeated ? busAt(b.id)! : i);
    if (reported[root]) continue;
    reported[root] = 1;
    const found = slacks.get(root) ?? [];
    if (found.length === 0)
      add(["buses", i], `Bus "${b.name}" (${b.id}) and the buses connected to it have no slack source; each connected group needs exactly one`);
    for (const extra of found.slice(1))
      add(["sources", extra, "control"], `${label("Source", net.sources[extra])} is a second slack in the group of bus "${b.name}"; each connected group needs exactly one`);
  }
}

/** Hours in a leap year: the most the cases together may stand for. */
export const HOURS_PER_LEAP_YEAR = 8784;

/** Operating cases name loads, sources and elements that exist, each once; only version 2 has them. */
function operatingCaseRules(net: Network, add: AddIssue): void {
  if (net.version < 2) {
    if (net.cases) add(["cases"], `operating cases need "version": 2`);
    if (net.growth) add(["growth"], `load growth needs "version": 2`);
  }
  const cases = net.cases ?? [];
  if (cases.length === 0) return;
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

