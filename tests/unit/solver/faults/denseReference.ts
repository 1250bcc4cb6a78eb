// An independent fault-level calculation for the tests: written from IEC 60909-0's formulas in
// physical units (ohms, siemens, kV; each bus at its nominal voltage, each transformer as an
// ideal winding-ratio transformer hvKV/lvKV behind its short-circuit impedance in ohms on the
// LV winding), sequence networks built straight from the network file, and the bus impedance
// matrix from a dense inverse by mathjs. It shares no code with solver/faults.
import { abs, add, complex, divide, inv, multiply, zeros, type Complex, type Matrix } from "mathjs";
import type { Network } from "#solver/schema.ts";

export interface ReferenceBusFault {
  id: string;
  /** Driving-point impedances in ohms at the bus's nominal voltage; null where unbounded. */
  z1Ohm: { re: number; im: number } | null;
  z0Ohm: { re: number; im: number } | null;
  ik3kA: number;
  ip3kA: number;
  ik1kA: number;
  rOverX: number;
  ipMethod: "radial" | "branch-sum" | "equivalent-frequency";
}

const cMax = (kV: number) => (kV > 1 ? 1.1 : 1.05);

// Zero-sequence behaviour of each winding letter (methods: an earthed star passes, a delta closes
// the current inside and is open from its terminals, an unearthed star is open; an earthed
// zigzag earths its own side and is decoupled from the other winding).
function windingLetters(group: string): { hv: string; lv: string } {
  const m = /^(YN|Y|D|ZN|Z)(yn|y|d|zn|z)\d+$/.exec(group);
  if (!m) throw new Error(`reference: unknown vector group ${group}`);
  return { hv: m[1], lv: m[2].toUpperCase() };
}

interface Stamp {
  a: number;
  b: number | null;
  /** ratio n at a: Y_aa += y/n², Y_bb += y, Y_ab −= y/n */
  n: number;
  zOhm: Complex;
}

function driving(count: number, stamps: Stamp[]): (Complex | null)[] {
  const z = impedanceMatrix(count, stamps);
  return [...Array(count).keys()].map((i) => z(i, i));
}

/** Z_ij in ohms (i's voltage for a current at j), null where either bus has no return path. */
function impedanceMatrix(count: number, stamps: Stamp[]): (i: number, j: number) => Complex | null {
  // Buses joined by a series branch share a group; a group with no shunt has no return path.
  const group = Array.from({ length: count }, (_, i) => i);
  const root = (i: number): number => (group[i] === i ? i : (group[i] = root(group[i])));
  const earthed = new Set<number>();
  for (const s of stamps) if (s.b !== null) group[root(s.a)] = root(s.b);
  for (const s of stamps) if (s.b === null) earthed.add(root(s.a));
  const kept = [...Array(count).keys()].filter((i) => earthed.has(root(i)));
  const at = new Map(kept.map((bus, k) => [bus, k]));
  const Y = zeros(kept.length, kept.length, "dense") as Matrix;
  const stamp = (i: number, j: number, v: Complex) => {
    Y.set([i, j], add(complex(Y.get([i, j]) as Complex), v));
  };
  for (const s of stamps) {
    const ia = at.get(s.a);
    if (ia === undefined) continue;
    const y = divide(complex(1, 0), s.zOhm) as Complex;
    if (s.b === null) {
      stamp(ia, ia, y);
      continue;
    }
    const ib = at.get(s.b)!;
    stamp(ia, ia, divide(y, s.n * s.n) as Complex);
    stamp(ib, ib, y);
    stamp(ia, ib, divide(y, -s.n) as Complex);
    stamp(ib, ia, divide(y, -s.n) as Complex);
  }
  const Z = kept.length > 0 ? (inv(Y) as Matrix) : Y;
  return (i, j) => {
    const a = at.get(i);
    const b = at.get(j);
    return a === undefined || b === undefined ? null : complex(Z.get([a, b]) as Complex);
  };
}

const kappaOf = (rOverX: number) => 1.02 + 0.98 * Math.exp(-3 * rOverX);

/**
 * How IEC 60909-0 (8.1) has i_p found at bus k, decided from the graph alone: a loop of series
 * branches in the group, or a branch that brings two sources, makes it meshed (method C);
 * otherwise one feeding branch is radial, several are summed.
 */
function peakMethodAt(k: number, stamps: Stamp[]): "radial" | "branch-sum" | "equivalent-frequency" {
  const series = stamps.filter((s) => s.b !== null);
  const neighbours = (i: number) => series.flatMap((s) => (s.a === i ? [s.b!] : s.b === i ? [s.a] : []));
  const group = new Set([k]);
  for (const queue = [k]; queue.length > 0; ) for (const n of neighbours(queue.pop()!)) if (!group.has(n)) (group.add(n), queue.push(n));
  const edges = series.filter((s) => group.has(s.a)).length;
  if (edges >= group.size) return "equivalent-frequency";
  const sourcesAt = (i: number) => stamps.filter((s) => s.b === null && s.a === i).length;
  const counts: number[] = Array.from({ length: sourcesAt(k) }, () => 1);
  for (const start of neighbours(k)) {
    const side = new Set([start]);
    for (const queue = [start]; queue.length > 0; ) for (const n of neighbours(queue.pop()!)) if (n !== k && !side.has(n)) (side.add(n), queue.push(n));
    counts.push([...side].reduce((sum, i) => sum + sourcesAt(i), 0));
  }
  const feeding = counts.filter((c) => c > 0);
  if (feeding.some((c) => c > 1)) return "equivalent-frequency";
  return feeding.length > 1 ? "branch-sum" : "radial";
}

export function referenceFaultLevels(net: Network): ReferenceBusFault[] {
  return referenceFaultCase(net, "maximum");
}

/** The minimum case: c_min, weakest infeeds, line resistances × 1.24 (80 °C), no converters. */
export function referenceMinimumFaultLevels(net: Network): ReferenceBusFault[] {
  return referenceFaultCase(net, "minimum");
}

function referenceFaultCase(net: Network, faultCase: "maximum" | "minimum"): ReferenceBusFault[] {
  const minimum = faultCase === "minimum";
  const cOf = (kV: number) => (minimum ? (kV > 1 ? 1 : 0.95) : cMax(kV));
  const hot = minimum ? 1 + 0.004 * (80 - 20) : 1;
  const index = new Map(net.buses.map((b, i) => [b.id, i]));
  const kv = net.buses.map((b) => b.nominalKV);
  const pos: Stamp[] = [];
  const zer: Stamp[] = [];

  for (const l of net.lines) {
    const a = index.get(l.fromBus)!;
    const b = index.get(l.toBus)!;
    pos.push({ a, b, n: 1, zOhm: complex(l.rOhmPerKm * l.lengthKm * hot, l.xOhmPerKm * l.lengthKm) });
    const r0 = l.r0OhmPerKm ?? 3 * l.rOhmPerKm;
    const x0 = l.x0OhmPerKm ?? 3 * l.xOhmPerKm;
    zer.push({ a, b, n: 1, zOhm: complex(r0 * l.lengthKm * hot, x0 * l.lengthKm) });
  }

  for (const t of net.transformers) {
    const hv = index.get(t.hvBus)!;
    const lv = index.get(t.lvBus)!;
    // IEC 60909-0: Z_T = u_kr/100 · U_rT²/S_rT, R_T = P_krT · U_rT² / S_rT² (both on the LV winding).
    const zT = (t.impedancePct / 100) * (t.lvKV * t.lvKV) / t.ratedMVA;
    const rT =
      t.loadLossKW !== undefined
        ? ((t.loadLossKW / 1000) * t.lvKV * t.lvKV) / (t.ratedMVA * t.ratedMVA)
        : zT * Math.cos(Math.atan(t.xOverR!));
    const xT = Math.sqrt(zT * zT - rT * rT);
    const xTRelative = xT / ((t.lvKV * t.lvKV) / t.ratedMVA);
    const kT = (0.95 * cMax(kv[lv])) / (1 + 0.6 * xTRelative);
    const z1 = complex(rT * kT, xT * kT);
    const n = t.hvKV / t.lvKV;
    pos.push({ a: hv, b: lv, n, zOhm: z1 });

    const { hv: h, lv: l } = windingLetters(t.vectorGroup);
    const zz = (letter: string) => t.z0OverZ1 ?? (letter === "ZN" ? 0.1 : 1);
    const z0OnLv = (letter: string) => multiply(z1, zz(letter)) as Complex;
    if (h === "YN" && l === "YN") zer.push({ a: hv, b: lv, n, zOhm: z0OnLv("YN") });
    else {
      const hvEarths = h === "ZN" || (h === "YN" && l === "D");
      const lvEarths = l === "ZN" || (l === "YN" && h === "D");
      if (hvEarths) zer.push({ a: hv, b: null, n: 1, zOhm: multiply(z0OnLv(h), n * n) as Complex });
      if (lvEarths) zer.push({ a: lv, b: null, n: 1, zOhm: z0OnLv(l) });
    }
  }

  const converters: { bus: number; currentKA: number }[] = [];
  for (const s of net.sources) {
    const k = index.get(s.bus)!;
    const un = kv[k];
    if (s.kind === "converter") {
      if (!minimum) converters.push({ bus: k, currentKA: ((s.faultCurrentPct! / 100) * s.ratedMVA!) / (Math.sqrt(3) * un) });
    } else if (s.kind === "grid") {
      const zQ = (cOf(un) * un * un) / (minimum ? (s.shortCircuitMinMVA ?? s.shortCircuitMVA!) : s.shortCircuitMVA!);
      const xOverR = s.xOverR ?? 10;
      const rQ = zQ / Math.sqrt(1 + xOverR * xOverR);
      const z = complex(rQ, rQ * xOverR);
      pos.push({ a: k, b: null, n: 1, zOhm: z });
      zer.push({ a: k, b: null, n: 1, zOhm: multiply(z, s.z0OverZ1 ?? 1) as Complex });
    } else {
      const urG = s.ratedKV ?? un;
      const srG = s.ratedMVA!;
      const xd = s.xdSubtransientPct! / 100;
      const cosPhi = s.ratedPowerFactor ?? 0.85;
      const kG = (un / urG) * cMax(un) / (1 + xd * Math.sqrt(1 - cosPhi * cosPhi));
      const xOhm = (xd * urG * urG) / srG;
      const rOhm = s.xOverR !== undefined ? xOhm / s.xOverR : xOhm * (urG <= 1 ? 0.15 : srG >= 100 ? 0.05 : 0.07);
      pos.push({ a: k, b: null, n: 1, zOhm: complex(rOhm * kG, xOhm * kG) });
    }
  }

  const count = net.buses.length;
  const Z1 = impedanceMatrix(count, pos);
  const z0 = driving(count, zer);
  const atFc = impedanceMatrix(count, pos.map((s) => ({ ...s, zOhm: complex(s.zOhm.re, s.zOhm.im * 0.4) })));
  return net.buses.map((bus, i) => {
    const un = kv[i];
    const c = cOf(un);
    const p = Z1(i, i);
    const q = z0[i];
    if (!p) return { id: bus.id, z1Ohm: null, z0Ohm: null, ik3kA: 0, ip3kA: 0, ik1kA: 0, rOverX: 0, ipMethod: peakMethodAt(i, pos) };
    const e = (c * un) / Math.sqrt(3);
    const ik3NetworkKA = e / (abs(p) as unknown as number);
    const rOverX = p.re / p.im;
    const method = peakMethodAt(i, pos);
    let ipNetworkKA: number;
    if (method === "equivalent-frequency") {
      const zc = atFc(i, i)!;
      ipNetworkKA = kappaOf((zc.re / zc.im) * 0.4) * Math.SQRT2 * ik3NetworkKA;
    } else {
      // Partial currents into the fault: each source shunt at i, and each series branch at i
      // carrying current from its far end, with the post-fault voltages V = −Z[:, i]·I_f.
      const fault = e / (abs(p) as unknown as number);
      const injected = divide(complex(-e, 0), p) as Complex;
      const voltage = (n: number) => multiply(Z1(n, i)!, injected) as Complex;
      // V_i = −e exactly: Z_ii·I_f with I_f = e/Z_ii.
      const vI = complex(-e, 0);
      const partial: Complex[] = [];
      for (const s of pos) {
        if (s.b === null) {
          if (s.a === i) partial.push(divide(complex(e, 0), s.zOhm) as Complex);
          continue;
        }
        if (s.a !== i && s.b !== i) continue;
        const y = divide(complex(1, 0), s.zOhm) as Complex;
        // Current from the branch into node i: Y_ia·V_a + Y_ib·V_b from the stamp, with sign reversed.
        const vA = s.a === i ? vI : voltage(s.a);
        const vB = s.b === i ? vI : voltage(s.b);
        const intoA = add(multiply(divide(y, s.n * s.n), vA), multiply(divide(y, -s.n), vB)) as Complex;
        const intoB = add(multiply(y, vB), multiply(divide(y, -s.n), vA)) as Complex;
        partial.push(multiply(s.a === i ? intoA : intoB, -1) as Complex);
      }
      ipNetworkKA = partial.reduce((sum, current) => {
        const size = abs(current) as unknown as number;
        if (size < 1e-12 * fault) return sum;
        const zBranch = divide(complex(e, 0), current) as Complex;
        return sum + kappaOf(zBranch.re / zBranch.im) * Math.SQRT2 * size;
      }, 0);
    }
    // Converters (IEC 60909-0:2016): |Z_ij|/|Z_ii|·I_skPF, 3|Z_ij|·I_skPF/|2Z(1) + Z(0)|, √2 on the peak.
    let share3 = 0;
    let transferSum = 0;
    for (const cv of converters) {
      const zij = Z1(i, cv.bus);
      if (!zij) continue;
      transferSum += (abs(zij) as unknown as number) * cv.currentKA;
    }
    share3 = transferSum / (abs(p) as unknown as number);
    const loop = q ? (abs(add(multiply(p, 2), q) as Complex) as unknown as number) : 0;
    const ik1kA = q ? (3 * e) / loop + (3 * transferSum) / loop : 0;
    return {
      id: bus.id,
      z1Ohm: { re: p.re, im: p.im },
      z0Ohm: q ? { re: q.re, im: q.im } : null,
      ik3kA: ik3NetworkKA + share3,
      ip3kA: ipNetworkKA + Math.SQRT2 * share3,
      ik1kA,
      rOverX,
      ipMethod: method,
    };
  });
}
