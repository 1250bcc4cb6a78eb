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

interface Edge {
  bus: string;
  /** Series impedance magnitude, per unit on the network's base (so that levels compare). */
  z: number;
  /** The transformer this edge is, if it is one. */
  transformer?: string;
}

/** The bus graph with each branch's series impedance, built once for every regulator. */
function busGraph(network: Network): Map<string, Edge[]> {
  const edges = new Map<string, Edge[]>();
  const link = (a: string, b: string, z: number, transformer?: string) => {
    let fromA = edges.get(a);
    if (!fromA) edges.set(a, (fromA = []));
    fromA.push({ bus: b, z, transformer });
    let fromB = edges.get(b);
    if (!fromB) edges.set(b, (fromB = []));
    fromB.push({ bus: a, z, transformer });
  };
  const kvOf = new Map(network.buses.map((b) => [b.id, b.nominalKV]));
  for (const l of network.lines) {
    const kv = kvOf.get(l.fromBus) ?? 1;
    link(l.fromBus, l.toBus, (Math.hypot(l.rOhmPerKm, l.xOhmPerKm) * l.lengthKm * network.baseMVA) / (kv * kv));
  }
  for (const t of network.transformers) link(t.hvBus, t.lvBus, (t.impedancePct / 100) * (network.baseMVA / t.ratedMVA), t.id);
  return edges;
}

/**
 * Electrical distance from `from` to `to` (the smallest sum of series impedances along a path),
 * optionally without crossing the transformer `skip`; Infinity when no such path exists. Dijkstra
 * with a binary heap that stops at `to`: n log n at worst, and a regulator's controlled bus is
 * usually its own winding's bus or next to it.
 */
function electricalDistance(graph: Map<string, Edge[]>, from: string, to: string, skip?: string): number {
  const best = new Map([[from, 0]]);
  const heap: [number, string][] = [[0, from]];
  const push = (item: [number, string]) => {
    heap.push(item);
    for (let i = heap.length - 1; i > 0; ) {
      const parent = (i - 1) >> 1;
      if (heap[parent][0] <= heap[i][0]) break;
      [heap[parent], heap[i]] = [heap[i], heap[parent]];
      i = parent;
    }
  };
  const pop = (): [number, string] => {
    const top = heap[0];
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      for (let i = 0; ; ) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < heap.length && heap[l][0] < heap[m][0]) m = l;
        if (r < heap.length && heap[r][0] < heap[m][0]) m = r;
        if (m === i) break;
        [heap[m], heap[i]] = [heap[i], heap[m]];
        i = m;
      }
    }
    return top;
  };
  while (heap.length > 0) {
    const [d, bus] = pop();
    if (d > (best.get(bus) ?? Infinity)) continue;
    if (bus === to) return d;
    for (const e of graph.get(bus) ?? []) {
      if (e.transformer !== undefined && e.transformer === skip) continue;
      const next = d + e.z;
      if (next < (best.get(e.bus) ?? Infinity)) {
        best.set(e.bus, next);
        push([next, e.bus]);
      }
    }
  }
  return Infinity;
}

function regulators(network: Network): Regulator[] {
  if (!network.transformers.some((t) => t.tapControl)) return [];
  const graph = busGraph(network);
  return network.transformers.flatMap((t, index) => {
    if (!t.tapControl) return [];
    const step = t.tapStepPct ?? DEFAULT_TAP_STEP_PCT;
    // The controlled bus lies on the LV side when it is reached from the LV winding without
    // crossing this transformer, and nearer there than from the HV winding the same way.
    const fromLv = electricalDistance(graph, t.lvBus, t.tapControl.bus, t.id);
    const fromHv = electricalDistance(graph, t.hvBus, t.tapControl.bus, t.id);
    const onLvSide = fromLv <= fromHv;
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
        distance: Math.min(fromLv, fromHv),
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
