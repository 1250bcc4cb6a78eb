// Cross-element rules of the network file, the ones a shape cannot express: unique ids, references,
// one slack per connected group, winding voltages against their buses, lines within one voltage
// level, possible vector groups, operating cases that name what exists. Each issue names the
// element and its path. Run on a document whose shape is already valid.
import type { Network } from "#solver/schema.ts";

/** IEC 60076-1 vector group: HV letters, LV letters, clock number 0–11 (e.g. YNd11, Dyn11, YNyn0). */
export const vectorGroupPattern = /^(YN|Y|D|ZN|Z)(yn|y|d|zn|z)(\d{1,2})$/;

/** Transformer winding voltages may differ from the bus nominal by this much (an off-nominal ratio). */
export const WINDING_TOLERANCE = 0.15;

function label(kind: string, element: { id: string; name: string }): string {
  return `${kind} "${element.name}" (${element.id})`;
}

/** Cross-element rules a shape cannot express; every issue names the element and its path. */
export function networkRules(net: Network, add: (path: (string | number)[], message: string) => void): void {
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

