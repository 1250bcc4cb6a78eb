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
  return [...Array(count).keys()].map((i) => {
    const k = at.get(i);
    return k === undefined ? null : complex(Z.get([k, k]) as Complex);
  });
}

export function referenceFaultLevels(net: Network): ReferenceBusFault[] {
  const index = new Map(net.buses.map((b, i) => [b.id, i]));
  const kv = net.buses.map((b) => b.nominalKV);
  const pos: Stamp[] = [];
  const zer: Stamp[] = [];

  for (const l of net.lines) {
    const a = index.get(l.fromBus)!;
    const b = index.get(l.toBus)!;
    pos.push({ a, b, n: 1, zOhm: complex(l.rOhmPerKm * l.lengthKm, l.xOhmPerKm * l.lengthKm) });
    const r0 = l.r0OhmPerKm ?? 3 * l.rOhmPerKm;
    const x0 = l.x0OhmPerKm ?? 3 * l.xOhmPerKm;
    zer.push({ a, b, n: 1, zOhm: complex(r0 * l.lengthKm, x0 * l.lengthKm) });
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

  for (const s of net.sources) {
    const k = index.get(s.bus)!;
    const un = kv[k];
    if (s.kind === "grid") {
      const zQ = (cMax(un) * un * un) / s.shortCircuitMVA!;
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

  const z1 = driving(net.buses.length, pos);
  const z0 = driving(net.buses.length, zer);
  return net.buses.map((bus, i) => {
    const un = kv[i];
    const c = cMax(un);
    const p = z1[i];
    const q = z0[i];
    if (!p) return { id: bus.id, z1Ohm: null, z0Ohm: null, ik3kA: 0, ip3kA: 0, ik1kA: 0, rOverX: 0 };
    const ik3kA = (c * un) / (Math.sqrt(3) * (abs(p) as unknown as number));
    const rOverX = p.re / p.im;
    const kappa = 1.02 + 0.98 * Math.exp(-3 * rOverX);
    const ik1kA = q ? (Math.sqrt(3) * c * un) / (abs(add(multiply(p, 2), q) as Complex) as unknown as number) : 0;
    return {
      id: bus.id,
      z1Ohm: { re: p.re, im: p.im },
      z0Ohm: q ? { re: q.re, im: q.im } : null,
      ik3kA,
      ip3kA: kappa * Math.SQRT2 * ik3kA,
      ik1kA,
      rOverX,
    };
  });
}
