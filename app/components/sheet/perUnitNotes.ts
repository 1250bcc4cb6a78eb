// The per-unit equivalent Details prints beside an impedance, computed with the solver's own
// per-unit functions so that the note and the load flow can never disagree.
import {
  impedanceBaseOhm,
  lineSeriesImpedancePu,
  transformerOwnImpedancePu,
  transformerSeriesImpedancePu,
} from "#solver/perUnit.ts";
import type { Bus, Line, Network, Source, Transformer } from "#solver/schema.ts";
import { type AnyElement, type ElementKind } from "#app/lib/networkElements.ts";

const sig = (v: number) => (Number.isFinite(v) ? String(Number(v.toPrecision(4))) : "–");
const complex = (r: number, x: number) => `${sig(r)} + j${sig(x)}`;

/** IEC 60909-0 voltage factor c_max: 1.10 above 1 kV, 1.05 at or below. */
const cMax = (nominalKV: number) => (nominalKV > 1 ? 1.1 : 1.05);

export function perUnitNotes(kind: ElementKind, element: AnyElement, doc: Network): string[] {
  const base = doc.baseMVA;
  const bus = (id: string): Bus | undefined => doc.buses.find((b) => b.id === id);
  const valid = (...values: (number | undefined)[]) => values.every((v) => v !== undefined && Number.isFinite(v) && v > 0);
  if (kind === "line") {
    const line = element as Line;
    const ref = bus(line.fromBus) ?? bus(line.toBus);
    const ohms = `Z = ${complex(line.rOhmPerKm * line.lengthKm, line.xOhmPerKm * line.lengthKm)} Ω over ${sig(line.lengthKm)} km`;
    if (!ref || !valid(ref.nominalKV)) return [ohms];
    const z = lineSeriesImpedancePu(line, ref, base);
    return [ohms, `z = ${complex(z.r, z.x)} pu on ${base} MVA, ${ref.nominalKV} kV`];
  }
  if (kind === "transformer") {
    const t = element as Transformer;
    if (!valid(t.ratedMVA, t.impedancePct)) return [];
    const own = transformerOwnImpedancePu(t);
    const notes = [`z = ${complex(own.r, own.x)} pu on its own ${t.ratedMVA} MVA`];
    const lv = bus(t.lvBus);
    if (lv && valid(lv.nominalKV, t.lvKV)) {
      const z = transformerSeriesImpedancePu(t, lv, base);
      notes.push(`z = ${complex(z.r, z.x)} pu on ${base} MVA`);
    }
    return notes;
  }
  if (kind === "source") {
    const source = element as Source;
    const at = bus(source.bus);
    if (!at || !valid(at.nominalKV)) return [];
    if (source.kind === "grid" && valid(source.shortCircuitMVA)) {
      const c = cMax(at.nominalKV);
      const zOhm = (c * at.nominalKV * at.nominalKV) / source.shortCircuitMVA!;
      return [`Z_Q = c·U²/S″kQ = ${sig(zOhm)} Ω = ${sig(zOhm / impedanceBaseOhm(at.nominalKV, base))} pu on ${base} MVA (c = ${c})`];
    }
    if (source.kind === "generator" && valid(source.xdSubtransientPct, source.ratedMVA)) {
      const ratio = (source.ratedKV ?? at.nominalKV) / at.nominalKV;
      const xd = (source.xdSubtransientPct! / 100) * (base / source.ratedMVA!) * ratio * ratio;
      return [`x″d = ${sig(xd)} pu on ${base} MVA`];
    }
  }
  return [];
}
