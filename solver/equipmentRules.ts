// Cross-element rules for the version 2 equipment fields: converter plants, regulating taps and
// minimum fault levels. Each issue names the element and its path.
import { busIndexOf } from "#solver/idIndex.ts";
import type { Network, Source } from "#solver/schema.ts";

/** Below this short-circuit ratio a converter plant's connection counts as weak unless the plant says otherwise (common practice). */
export const DEFAULT_MIN_SHORT_CIRCUIT_RATIO = 3;

/** The lowest short-circuit ratio asked at a converter plant's bus: its own minShortCircuitRatio, else 3. */
export function minShortCircuitRatio(source: Pick<Source, "minShortCircuitRatio">): number {
  return source.minShortCircuitRatio ?? DEFAULT_MIN_SHORT_CIRCUIT_RATIO;
}

type Add = (path: (string | number)[], message: string) => void;

const label = (kind: string, element: { id: string; name: string }) => `${kind} "${element.name}" (${element.id})`;

export function equipmentRules(net: Network, add: Add): void {
  const needsVersion2 = (path: (string | number)[], what: string) => {
    if (net.version < 2) add(path, `${what} needs "version": 2`);
  };
  net.buses.forEach((b, i) => {
    if (b.minFaultMVA !== undefined) needsVersion2(["buses", i, "minFaultMVA"], "a minimum fault level");
  });

  net.sources.forEach((s, i) => {
    const who = label("Source", s);
    if (s.shortCircuitMinMVA !== undefined) {
      needsVersion2(["sources", i, "shortCircuitMinMVA"], "a minimum infeed");
      if (s.kind !== "grid") add(["sources", i, "shortCircuitMinMVA"], `${who}: only a grid infeed has shortCircuitMinMVA`);
      else if (s.shortCircuitMVA !== undefined && s.shortCircuitMinMVA > s.shortCircuitMVA)
        add(["sources", i, "shortCircuitMinMVA"], `${who}: shortCircuitMinMVA ${s.shortCircuitMinMVA} is above its maximum shortCircuitMVA ${s.shortCircuitMVA}`);
    }
    if (s.kind === "converter") {
      needsVersion2(["sources", i, "kind"], "a converter plant");
      if (s.control === "slack")
        add(["sources", i, "control"], `${who}: a converter plant cannot be the slack; control it by "pq", "pv" or "pf"`);
      if (s.ratedMVA === undefined) add(["sources", i, "ratedMVA"], `${who}: a converter plant needs ratedMVA`);
      if (s.faultCurrentPct === undefined)
        add(["sources", i, "faultCurrentPct"], `${who}: a converter plant needs its maximum short-circuit current faultCurrentPct (% of rated current)`);
    } else if (s.faultCurrentPct !== undefined) add(["sources", i, "faultCurrentPct"], `${who}: only a converter plant has faultCurrentPct`);
    if (s.minShortCircuitRatio !== undefined && s.kind !== "converter")
      add(["sources", i, "minShortCircuitRatio"], `${who}: only a converter plant has a minimum short-circuit ratio`);
    if (s.control === "pf") {
      needsVersion2(["sources", i, "control"], "power-factor control");
      if (s.kind !== "converter") add(["sources", i, "control"], `${who}: only a converter plant runs at a set power factor`);
      if (s.powerFactor === undefined || s.powerFactor === 0)
        add(["sources", i, "powerFactor"], `${who}: power-factor control needs a powerFactor other than 0 (+ supplies reactive power, − absorbs it)`);
    } else if (s.powerFactor !== undefined) add(["sources", i, "powerFactor"], `${who}: powerFactor is used only with control "pf"`);
  });

  const busIndex = busIndexOf(net);
  net.transformers.forEach((t, i) => {
    if (!t.tapControl) return;
    const who = label("Transformer", t);
    needsVersion2(["transformers", i, "tapControl"], "a regulating tap changer");
    if (busIndex.get(t.tapControl.bus) === undefined)
      add(["transformers", i, "tapControl", "bus"], `${who} regulates bus "${t.tapControl.bus}", which does not exist`);
    const min = t.tapMinPct ?? -Infinity;
    const max = t.tapMaxPct ?? Infinity;
    if (min >= max) add(["transformers", i, "tapMaxPct"], `${who}: its highest tap ${t.tapMaxPct} % must be above its lowest ${t.tapMinPct} % for the tap changer to regulate`);
    if (t.tapPct < min || t.tapPct > max)
      add(["transformers", i, "tapPct"], `${who}: its starting tap ${t.tapPct} % lies outside its range ${t.tapMinPct} to ${t.tapMaxPct} %`);
  });
}

/** Whether a network uses any version 2 equipment field (converter plants, pf control, regulating taps, minimum fault levels). */
export function usesVersion2Equipment(net: Pick<Network, "buses" | "sources" | "transformers">): boolean {
  return (
    (net.buses ?? []).some((b) => b.minFaultMVA !== undefined) ||
    (net.sources ?? []).some((s) => s.kind === "converter" || s.control === "pf" || s.shortCircuitMinMVA !== undefined || s.faultCurrentPct !== undefined || s.powerFactor !== undefined || s.minShortCircuitRatio !== undefined) ||
    (net.transformers ?? []).some((t) => t.tapControl !== undefined)
  );
}

/** The network as version 2 when an edit has given it a version 2 field; otherwise unchanged. */
export function withNeededVersion<T extends Pick<Network, "version" | "buses" | "sources" | "transformers">>(net: T): T {
  return net.version < 2 && usesVersion2Equipment(net) ? { ...net, version: 2 } : net;
}
