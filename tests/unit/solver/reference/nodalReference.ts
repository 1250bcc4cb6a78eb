// An independent load flow for the tests: a dense nodal model on mathjs complex numbers, solved by
// Newton's method in rectangular coordinates with a Jacobian taken by central differences and a
// dense LU from mathjs. It reads the network document itself (no production model code), so an
// error in the production per-unit model, admittance matrix or sparse Newton shows as a disagreement.
import { abs, add, arg, complex, conj, divide, lusolve, multiply, subtract, type Complex } from "mathjs";
import type { Network } from "#solver/schema.ts";

export interface ReferenceBranch {
  id: string;
  pFromMW: number;
  qFromMvar: number;
  pToMW: number;
  qToMvar: number;
  lossKW: number;
  currentA: number;
}

export interface ReferenceSolution {
  converged: boolean;
  voltage: Complex[];
  vPu: number[];
  angleDeg: number[];
  branches: ReferenceBranch[];
  slackMW: Record<string, number>;
  loadMW: number;
}

interface TwoPort {
  id: string;
  from: number;
  to: number;
  yff: Complex;
  yft: Complex;
  ytf: Complex;
  ytt: Complex;
}

type Role = "slack" | "pv" | "pq";

const ZERO = complex(0, 0);

/** Two-port admittances read straight from the document, in per unit of each bus's own base. */
function twoPorts(net: Network, index: Map<string, number>): TwoPort[] {
  const base = net.baseMVA;
  const kv = (id: string) => net.buses[index.get(id)!].nominalKV;
  const ports: TwoPort[] = [];
  for (const line of net.lines) {
    const zBase = kv(line.fromBus) ** 2 / base;
    const series = divide(1, complex((line.rOhmPerKm * line.lengthKm) / zBase, (line.xOhmPerKm * line.lengthKm) / zBase)) as Complex;
    const halfCharging = complex(0, ((line.bMicroSiemensPerKm ?? 0) * 1e-6 * line.lengthKm * zBase) / 2);
    ports.push({
      id: line.id,
      from: index.get(line.fromBus)!,
      to: index.get(line.toBus)!,
      yff: add(series, halfCharging) as Complex,
      yft: multiply(-1, series) as Complex,
      ytf: multiply(-1, series) as Complex,
      ytt: add(series, halfCharging) as Complex,
    });
  }
  for (const t of net.transformers) {
    // Short-circuit impedance in ohms referred to the LV winding, then on the LV bus's base.
    const zOwn = t.impedancePct / 100;
    const rOwn = t.loadLossKW !== undefined ? t.loadLossKW / 1000 / t.ratedMVA : zOwn / Math.sqrt(1 + (t.xOverR ?? Infinity) ** 2);
    const xOwn = Math.sqrt(zOwn ** 2 - rOwn ** 2);
    const zOhmLv = complex((rOwn * t.lvKV ** 2) / t.ratedMVA, (xOwn * t.lvKV ** 2) / t.ratedMVA);
    const series = divide(1, divide(zOhmLv, kv(t.lvBus) ** 2 / base)) as Complex;
    // Turns ratio in per unit: HV winding (with its tap) against the LV winding, each on its bus base.
    const turns = (t.hvKV * (1 + t.tapPct / 100)) / kv(t.hvBus) / (t.lvKV / kv(t.lvBus));
    // The ideal winding on the HV side: V_inner = V_hv / turns, I_hv = I_inner / turns.
    const core = complex((t.noLoadLossKW ?? 0) / 1000 / base, 0);
    ports.push({
      id: t.id,
      from: index.get(t.hvBus)!,
      to: index.get(t.lvBus)!,
      yff: add(divide(series, turns * turns), core) as Complex,
      yft: divide(multiply(-1, series), turns) as Complex,
      ytf: divide(multiply(-1, series), turns) as Complex,
      ytt: series,
    });
  }
  return ports;
}

function busAdmittance(net: Network, index: Map<string, number>, ports: TwoPort[]): Complex[][] {
  const n = net.buses.length;
  const y: Complex[][] = Array.from({ length: n }, () => Array.from({ length: n }, () => ZERO));
  for (const p of ports) {
    y[p.from][p.from] = add(y[p.from][p.from], p.yff) as Complex;
    y[p.from][p.to] = add(y[p.from][p.to], p.yft) as Complex;
    y[p.to][p.from] = add(y[p.to][p.from], p.ytf) as Complex;
    y[p.to][p.to] = add(y[p.to][p.to], p.ytt) as Complex;
  }
  for (const s of net.shunts) {
    const i = index.get(s.bus)!;
    y[i][i] = add(y[i][i], complex(0, s.qMvar / net.baseMVA)) as Complex;
  }
  return y;
}

/** Injections S_i = V_i · conj(Σ Y_ij V_j). */
function injections(y: Complex[][], v: Complex[]): Complex[] {
  return y.map((row, i) => {
    let current: Complex = ZERO;
    row.forEach((yij, j) => (current = add(current, multiply(yij, v[j])) as Complex));
    return multiply(v[i], conj(current)) as Complex;
  });
}

const exponent = { "constant-power": 0, "constant-current": 1, "constant-impedance": 2 } as const;

export function referenceLoadFlow(net: Network): ReferenceSolution {
  const n = net.buses.length;
  const base = net.baseMVA;
  const index = new Map(net.buses.map((b, i) => [b.id, i]));
  const ports = twoPorts(net, index);
  const y = busAdmittance(net, index, ports);

  const role: Role[] = Array(n).fill("pq");
  const setV = Array(n).fill(1);
  const setAngle = Array(n).fill(0);
  const fixedP = Array(n).fill(0);
  const fixedQ = Array(n).fill(0);
  const qLow = Array(n).fill(0);
  const qHigh = Array(n).fill(0);
  for (const s of net.sources.filter((s) => s.control === "slack")) {
    const i = index.get(s.bus)!;
    role[i] = "slack";
    setV[i] = s.voltagePu;
    setAngle[i] = (s.angleDeg * Math.PI) / 180;
  }
  for (const s of net.sources) {
    const i = index.get(s.bus)!;
    if (s.control === "slack") continue;
    fixedP[i] += s.pMW / base;
    if (s.control === "pq") fixedQ[i] += s.qMvar / base;
    else {
      if (role[i] === "pq") {
        role[i] = "pv";
        setV[i] = s.voltagePu;
      }
      qLow[i] += (s.qMinMvar ?? -Infinity) / base;
      qHigh[i] += (s.qMaxMvar ?? Infinity) / base;
    }
  }
  const loadAt = (i: number, vm: number): Complex => {
    let p = 0;
    let q = 0;
    for (const l of net.loads) {
      if (index.get(l.bus) !== i) continue;
      const scale = vm ** exponent[l.model];
      p += (l.pMW / base) * scale;
      q += (l.qMvar / base) * scale;
    }
    return complex(p, q);
  };

  // Which buses regulate their voltage now, and the reactive output held by those at a limit.
  const regulating = role.map((r) => r === "pv");
  const held = Array(n).fill(0);
  const heldAtUpper = Array(n).fill(false);

  const residual = (x: number[]): number[] => {
    const v = Array.from({ length: n }, (_, i) => complex(x[2 * i], x[2 * i + 1]));
    const s = injections(y, v);
    const out: number[] = [];
    for (let i = 0; i < n; i++) {
      const vm = Math.hypot(x[2 * i], x[2 * i + 1]);
      if (role[i] === "slack") {
        out.push(x[2 * i] - setV[i] * Math.cos(setAngle[i]), x[2 * i + 1] - setV[i] * Math.sin(setAngle[i]));
        continue;
      }
      const load = loadAt(i, vm);
      out.push(s[i].re - (fixedP[i] - load.re));
      if (regulating[i]) out.push(vm * vm - setV[i] * setV[i]);
      else out.push(s[i].im - (fixedQ[i] + held[i] - load.im));
    }
    return out;
  };

  const flatAngle = setAngle[role.indexOf("slack")] ?? 0;
  const flatState = (): number[] => {
    const state: number[] = [];
    for (let i = 0; i < n; i++) {
      const vm = regulating[i] || role[i] === "slack" ? setV[i] : 1;
      const va = role[i] === "slack" ? setAngle[i] : flatAngle;
      state.push(vm * Math.cos(va), vm * Math.sin(va));
    }
    return state;
  };
  const x: number[] = flatState();

  const newton = (): boolean => {
    for (let iteration = 0; iteration < 60; iteration++) {
      const f = residual(x);
      const worst = Math.max(...f.map(Math.abs));
      if (!Number.isFinite(worst) || worst > 1e8) return false;
      if (worst < 1e-13) return true;
      const jacobian: number[][] = f.map(() => Array(2 * n).fill(0));
      for (let k = 0; k < 2 * n; k++) {
        const h = 1e-7 * Math.max(1, Math.abs(x[k]));
        const saved = x[k];
        x[k] = saved + h;
        const up = residual(x);
        x[k] = saved - h;
        const down = residual(x);
        x[k] = saved;
        for (let r = 0; r < f.length; r++) jacobian[r][k] = (up[r] - down[r]) / (2 * h);
      }
      let step: number[];
      try {
        step = (lusolve(jacobian, f.map((value) => -value)) as number[][]).map((row) => row[0]);
      } catch {
        return false;
      }
      for (let k = 0; k < 2 * n; k++) x[k] += step[k];
    }
    return Math.max(...residual(x).map(Math.abs)) < 1e-11;
  };

  const voltages = () => Array.from({ length: n }, (_, i) => complex(x[2 * i], x[2 * i + 1]));
  let converged = newton();
  // A set-point no reactive output can hold (a voltage across a short resistive line that would
  // need more real power than the bus has) leaves the regulating solve without a solution. Then
  // every regulating bus is held at the reactive limit its output was heading for, the state is
  // reset to a flat start, and the limit rounds below may release it again.
  if (!converged) {
    const s = injections(y, voltages());
    for (let i = 0; i < n; i++) {
      if (!regulating[i]) continue;
      const output = s[i].im + loadAt(i, Math.hypot(x[2 * i], x[2 * i + 1])).im - fixedQ[i];
      regulating[i] = false;
      heldAtUpper[i] = Number.isFinite(output) ? output > (qLow[i] + qHigh[i]) / 2 : true;
      held[i] = heldAtUpper[i] ? qHigh[i] : qLow[i];
    }
    x.splice(0, x.length, ...flatState());
    converged = newton();
  }
  // Reactive limits: a regulating bus beyond a limit is held there; it returns when its voltage allows.
  for (let round = 0; converged && round < 20; round++) {
    const s = injections(y, voltages());
    let changed = false;
    for (let i = 0; i < n; i++) {
      if (role[i] !== "pv") continue;
      const vm = Math.hypot(x[2 * i], x[2 * i + 1]);
      const output = s[i].im + loadAt(i, vm).im - fixedQ[i];
      if (regulating[i] && (output > qHigh[i] + 1e-9 || output < qLow[i] - 1e-9)) {
        regulating[i] = false;
        heldAtUpper[i] = output > qHigh[i];
        held[i] = heldAtUpper[i] ? qHigh[i] : qLow[i];
        changed = true;
      } else if (!regulating[i] && (heldAtUpper[i] ? vm > setV[i] + 1e-9 : vm < setV[i] - 1e-9)) {
        regulating[i] = true;
        held[i] = 0;
        changed = true;
      }
    }
    if (!changed) break;
    converged = newton();
  }

  const v = voltages();
  const branches = ports.map((p): ReferenceBranch => {
    const iFrom = add(multiply(p.yff, v[p.from]), multiply(p.yft, v[p.to])) as Complex;
    const iTo = add(multiply(p.ytf, v[p.from]), multiply(p.ytt, v[p.to])) as Complex;
    const sFrom = multiply(multiply(v[p.from], conj(iFrom)), base) as Complex;
    const sTo = multiply(multiply(v[p.to], conj(iTo)), base) as Complex;
    const amps = (i: number, current: Complex) => ((abs(current) as unknown as number) * base * 1000) / (Math.sqrt(3) * net.buses[i].nominalKV);
    return {
      id: p.id,
      pFromMW: sFrom.re,
      qFromMvar: sFrom.im,
      pToMW: sTo.re,
      qToMvar: sTo.im,
      lossKW: (add(sFrom, sTo) as Complex).re * 1000,
      currentA: Math.max(amps(p.from, iFrom), amps(p.to, iTo)),
    };
  });
  const s = injections(y, v);
  const slackMW: Record<string, number> = {};
  for (const src of net.sources.filter((src) => src.control === "slack")) {
    const i = index.get(src.bus)!;
    slackMW[src.id] = (s[i].re + loadAt(i, abs(v[i]) as unknown as number).re - fixedP[i]) * base;
  }
  const loadMW = net.loads.reduce((sum, l) => sum + l.pMW * (abs(v[index.get(l.bus)!]) as unknown as number) ** exponent[l.model], 0);
  return {
    converged,
    voltage: v,
    vPu: v.map((vi) => abs(vi) as unknown as number),
    angleDeg: v.map((vi) => ((arg(vi) as number) * 180) / Math.PI),
    branches,
    slackMW,
    loadMW,
  };
}

/** Largest distance between two complex bus voltage vectors, in pu. */
export function largestVoltageGap(a: Complex[], b: { vPu: number; angleDeg: number }[]): number {
  return Math.max(
    ...a.map((va, i) => {
      const theta = (b[i].angleDeg * Math.PI) / 180;
      return abs(subtract(va, complex(b[i].vPu * Math.cos(theta), b[i].vPu * Math.sin(theta))) as Complex) as unknown as number;
    }),
  );
}
