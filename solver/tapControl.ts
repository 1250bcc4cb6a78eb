// On-load tap changers around the load flow: after Newton–Raphson converges, the regulating
// transformer whose controlled bus lies outside its band and is electrically nearest to it moves
// one step toward the band; the network is solved again. The loop stops when every regulated bus
// is inside its band or its tap is at a limit. A transformer that would step back to a position
// it has just left is held there instead, so two regulators can never chase each other.
import type { LoadFlowResult } from "#solver/results.ts";
import type { Network, Transformer } from "#solver/schema.ts";

/** A step count well beyond any real tap range, so a bug cannot loop for ever. */
const MAX_TAP_MOVES = 500;
/** Default range and step of an on-load tap changer when the transformer does not say (common practice). */
export const DEFAULT_TAP_RANGE_PCT = 10;
export const DEFAULT_TAP_STEP_PCT = 1.25;

export interface TapPosition {
  transformerId: string;
  tapPct: number;
  /** The range ran out before the band was reached. */
  tapLimited: boolean;
}

export interface RegulatedLoadFlow {
  result: LoadFlowResult;
  network: Network;
  taps: TapPosition[];
  /** Solves it took, the first included. */
  solves: number;
}

interface Regulator {
  index: number;
  transformer: Transformer;
  control: NonNullable<Transformer["tapControl"]>;
  min: number;
  max: number;
  step: number;
  /** +1 when raising the HV tap raises the controlled bus's voltage (it lies on the HV side), else −1. */
  voltagePerTapSign: number;
  distance: number;
}

/** Buses reached from `start` without crossing the transformer `skip`. */
function reachable(network: Network, start: string, skip: string): Set<string> {
  const neighbours = new Map<string, string[]>();
  const link = (a: string, b: string) => {
    neighbours.set(a, [...(neighbours.get(a) ?? []), b]);
    neighbours.set(b, [...(neighbours.get(b) ?? []), a]);
  };
  for (const l of network.lines) link(l.fromBus, l.toBus);
  for (const t of network.transformers) if (t.id !== skip) link(t.hvBus, t.lvBus);
  const seen = new Set([start]);
  const queue = [start];
  while (queue.length > 0) for (const next of neighbours.get(queue.pop()!) ?? []) if (!seen.has(next)) (seen.add(next), queue.push(next));
  return seen;
}

/**
 * Electrical distance from a winding's bus to the controlled bus: the smallest sum of series
 * impedance magnitudes (ohms referred to per unit of each element's own voltage, so that levels
 * compare) along a path. Dijkstra on a small graph; regulators are few.
 */
function electricalDistance(network: Network, from: string, to: string): number {
  const edges = new Map<string, { bus: string; z: number }[]>();
  const link = (a: string, b: string, z: number) => {
    edges.set(a, [...(edges.get(a) ?? []), { bus: b, z }]);
    edges.set(b, [...(edges.get(b) ?? []), { bus: a, z }]);
  };
  const kvOf = new Map(network.buses.map((b) => [b.id, b.nominalKV]));
  for (const l of network.lines) {
    const kv = kvOf.get(l.fromBus) ?? 1;
    link(l.fromBus, l.toBus, (Math.hypot(l.rOhmPerKm, l.xOhmPerKm) * l.lengthKm * network.baseMVA) / (kv * kv));
  }
  for (const t of network.transformers) link(t.hvBus, t.lvBus, (t.impedancePct / 100) * (network.baseMVA / t.ratedMVA));
  const best = new Map([[from, 0]]);
  const open = new Set([from]);
  while (open.size > 0) {
    let bus = "";
    let d = Infinity;
    for (const b of open) if (best.get(b)! < d) (bus = b), (d = best.get(b)!);
    open.delete(bus);
    if (bus === to) return d;
    for (const e of edges.get(bus) ?? [])
      if (d + e.z < (best.get(e.bus) ?? Infinity)) (best.set(e.bus, d + e.z), open.add(e.bus));
  }
  return Infinity;
}

function regulators(network: Network): Regulator[] {
  return network.transformers.flatMap((t, index) => {
    if (!t.tapControl) return [];
    const step = t.tapStepPct ?? DEFAULT_TAP_STEP_PCT;
    const onLvSide = reachable(network, t.lvBus, t.id).has(t.tapControl.bus);
    const winding = onLvSide ? t.lvBus : t.hvBus;
    return [
      {
        index,
        transformer: t,
        control: t.tapControl,
        min: t.tapMinPct ?? -DEFAULT_TAP_RANGE_PCT,
        max: t.tapMaxPct ?? DEFAULT_TAP_RANGE_PCT,
        step,
        // A positive HV tap adds HV turns: the LV side's voltage falls, the HV side's rises.
        voltagePerTapSign: onLvSide ? -1 : 1,
        distance: electricalDistance(network, winding, t.tapControl.bus),
      },
    ];
  });
}

const EPSILON = 1e-9;

export function regulateTaps(network: Network, solve: (network: Network) => LoadFlowResult): RegulatedLoadFlow {
  const regs = regulators(network).sort((a, b) => a.distance - b.distance);
  let current = network;
  let result = solve(current);
  let solves = 1;
  const taps = new Map(regs.map((r) => [r.transformer.id, r.transformer.tapPct]));
  const limited = new Set<string>();
  const lastMove = new Map<string, number>();
  const held = new Set<string>();

  for (let moves = 0; moves < MAX_TAP_MOVES && result.converged; moves++) {
    const voltage = new Map(result.buses.map((b) => [b.id, b.vPu]));
    let moved = false;
    limited.clear();
    for (const r of regs) {
      if (held.has(r.transformer.id)) continue;
      const v = voltage.get(r.control.bus);
      if (v === undefined) continue;
      const half = r.control.bandPu / 2;
      const error = v < r.control.targetPu - half - EPSILON ? 1 : v > r.control.targetPu + half + EPSILON ? -1 : 0;
      if (error === 0) continue;
      const direction = error * r.voltagePerTapSign;
      const tap = taps.get(r.transformer.id)!;
      const next = Math.min(r.max, Math.max(r.min, tap + direction * r.step));
      if (Math.abs(next - tap) < EPSILON) {
        limited.add(r.transformer.id);
        continue;
      }
      if (lastMove.get(r.transformer.id) === -direction) {
        // Stepping back would undo the last step: the band is narrower than one step here.
        held.add(r.transformer.id);
        continue;
      }
      taps.set(r.transformer.id, Number(next.toFixed(9)));
      lastMove.set(r.transformer.id, direction);
      moved = true;
      break;
    }
    if (!moved) break;
    const next = {
      ...network,
      transformers: network.transformers.map((t) => (taps.has(t.id) ? { ...t, tapPct: taps.get(t.id)! } : t)),
    };
    const nextResult = solve(next);
    solves++;
    if (!nextResult.converged) {
      // The step took the network past what it can carry: keep the last position that solved.
      for (const t of current.transformers) if (taps.has(t.id)) taps.set(t.id, t.tapPct);
      for (const r of regs) held.add(r.transformer.id);
      break;
    }
    current = next;
    result = nextResult;
  }

  return {
    result,
    network: current,
    taps: regs.map((r) => ({ transformerId: r.transformer.id, tapPct: taps.get(r.transformer.id)!, tapLimited: limited.has(r.transformer.id) })),
    solves,
  };
}
