// On-load tap changers around the load flow: after Newton–Raphson converges, the regulating
// transformer whose controlled bus lies outside its band and is electrically nearest to it moves
// toward the band by as many steps as its voltage error calls for (from dV/dtap); the network is
// solved again. The loop stops when every regulated bus is inside its band or its tap is at a
// limit. A regulator never returns to a position it has tried (it stays between the positions
// found too low and too high), so two regulators can never chase each other.
import type { LoadFlowResult } from "#solver/results.ts";
import type { Network, Transformer } from "#solver/schema.ts";

/** A move count well beyond any real tap range, so a bug cannot loop for ever. */
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

/** What one regulator has learnt so far: the tap positions known to be too low or too high, and dV/dtap. */
interface Search {
  /** Highest tap known to need a higher tap, and lowest known to need a lower one: the band lies between. */
  needsUp: number;
  needsDown: number;
  /** Voltage of the controlled bus per % of tap, from the last two solves (the ratio law until then). */
  perPct: number | null;
  /** Set after a multi-step move failed to solve: from then on one step at a time. */
  singleSteps: boolean;
}

/**
 * How far to move: the number of steps that brings the controlled bus to the near edge of its
 * band, at least one, toward the band. The first move follows the ideal transformer's ratio law
 * (the LV side's voltage goes as 1/(1 + tap/100), the HV side's as 1 + tap/100); later moves use
 * dV/dtap measured between this regulator's last two solves, which includes the load's response.
 */
function stepsToBand(r: Regulator, search: Search, tapPct: number, v: number, lowEdge: number, highEdge: number): number {
  if (search.singleSteps) return 1;
  const edge = v < lowEdge ? lowEdge : highEdge;
  const ratio = 1 + tapPct / 100;
  const neededPct =
    search.perPct !== null ? (edge - v) / search.perPct : r.voltagePerTapSign < 0 ? 100 * ((v * ratio) / edge - ratio) : 100 * ((edge * ratio) / v - ratio);
  const steps = Math.ceil(Math.abs(neededPct) / r.step - 1e-6);
  return Number.isFinite(steps) ? Math.max(1, steps) : 1;
}

/**
 * Regulate the taps around `solve`. After each converged solve the out-of-band regulator nearest
 * its bus moves by the number of steps its voltage error calls for (stepsToBand), clamped to its
 * range and kept strictly between the positions already found too low and too high, so that it
 * never returns to a position it has tried: the loop ends, without oscillating, when every bus is
 * in its band, a range has run out, or no untried position lies between a too-low and a too-high
 * one (the band is narrower than a step there; the regulator is held).
 */
export function regulateTaps(network: Network, solve: (network: Network) => LoadFlowResult): RegulatedLoadFlow {
  const regs = regulators(network).sort((a, b) => a.distance - b.distance);
  let current = network;
  let result = solve(current);
  let solves = 1;
  // Most networks regulate nothing: answer without reading a single voltage back.
  if (regs.length === 0) return { result, network: current, taps: [], solves };
  const taps = new Map(regs.map((r) => [r.transformer.id, r.transformer.tapPct]));
  const searches = new Map<string, Search>(regs.map((r) => [r.transformer.id, { needsUp: -Infinity, needsDown: Infinity, perPct: null, singleSteps: false }]));
  const limited = new Set<string>();
  const held = new Set<string>();
  let lastMove: { id: string; fromPct: number; fromVPu: number } | null = null;
  // Only the controlled buses' voltages are read back, so no map of every bus per solve.
  const controlled = new Set(regs.map((r) => r.control.bus));

  for (let moves = 0; moves < MAX_TAP_MOVES && result.converged; moves++) {
    const voltage = new Map<string, number>();
    for (const b of result.buses) if (controlled.has(b.id)) voltage.set(b.id, b.vPu);
    if (lastMove) {
      // The measured sensitivity of the regulator that just moved, when it has the expected sign.
      const r = regs.find((x) => x.transformer.id === lastMove!.id)!;
      const search = searches.get(lastMove.id)!;
      const perPct = (voltage.get(r.control.bus)! - lastMove.fromVPu) / (taps.get(lastMove.id)! - lastMove.fromPct);
      if (Number.isFinite(perPct) && perPct * r.voltagePerTapSign > 1e-6) search.perPct = perPct;
    }
    let moved = false;
    limited.clear();
    for (const r of regs) {
      const id = r.transformer.id;
      if (held.has(id)) continue;
      const v = voltage.get(r.control.bus);
      if (v === undefined) continue;
      const half = r.control.bandPu / 2;
      const lowEdge = r.control.targetPu - half;
      const highEdge = r.control.targetPu + half;
      const error = v < lowEdge - EPSILON ? 1 : v > highEdge + EPSILON ? -1 : 0;
      if (error === 0) continue;
      const direction = error * r.voltagePerTapSign;
      const tap = taps.get(id)!;
      const search = searches.get(id)!;
      if (direction > 0) search.needsUp = Math.max(search.needsUp, tap);
      else search.needsDown = Math.min(search.needsDown, tap);
      const wanted = tap + direction * stepsToBand(r, search, tap, v, lowEdge, highEdge) * r.step;
      let next = Math.min(r.max, Math.max(r.min, wanted));
      // Never onto or past a position already found on the other side of the band.
      if (direction > 0 && next >= search.needsDown - EPSILON) next = tap + Math.floor((search.needsDown - tap) / r.step - 1e-6) * r.step;
      if (direction < 0 && next <= search.needsUp + EPSILON) next = tap - Math.floor((tap - search.needsUp) / r.step - 1e-6) * r.step;
      if (Math.abs(next - tap) < EPSILON || (next - tap) * direction < 0) {
        if (Math.abs(tap - (direction > 0 ? r.max : r.min)) < EPSILON) limited.add(id);
        // Otherwise a too-low and a too-high position are one step apart: the band is narrower than a step.
        else held.add(id);
        continue;
      }
      lastMove = { id, fromPct: tap, fromVPu: v };
      taps.set(id, Number(next.toFixed(9)));
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
      // The move took the network past what it can carry: back to the last position that solved.
      const { id, fromPct } = lastMove!;
      const search = searches.get(id)!;
      const movedSteps = Math.abs(taps.get(id)! - fromPct) / regs.find((r) => r.transformer.id === id)!.step;
      taps.set(id, fromPct);
      lastMove = null;
      // A multi-step move may have gone too far at once: try again one step at a time; a single
      // step that fails ends the regulation where it last solved.
      if (movedSteps > 1 + EPSILON && !search.singleSteps) {
        search.singleSteps = true;
        continue;
      }
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
