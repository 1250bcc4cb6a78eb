// Applying an equipment type from the library to a transformer or line in the network.
import { conductorAtFrequency, type ConductorType, type TransformerType } from "#app/lib/equipmentLibrary.ts";
import { transformerOwnImpedancePu } from "#solver/perUnit.ts";
import type { Line, Transformer } from "#solver/schema.ts";

/**
 * A type sets the rating and impedance. Losses belong to one unit: the old ones go unless the
 * type brings its own. Without losses the resistance comes from X/R, which is kept from the
 * element (its own, or the one its old losses implied) unless the type gives one.
 */
export function applyTransformerType(t: Transformer, type: TransformerType): Transformer {
  const own = transformerOwnImpedancePu(t);
  const impliedXOverR = own.r > 0 && own.x > 0 ? Number((own.x / own.r).toPrecision(3)) : undefined;
  const next: Transformer = { ...t, ratedMVA: type.ratedMVA, impedancePct: type.impedancePct };
  delete next.loadLossKW;
  delete next.noLoadLossKW;
  if (type.loadLossKW !== undefined) next.loadLossKW = type.loadLossKW;
  if (type.noLoadLossKW !== undefined) next.noLoadLossKW = type.noLoadLossKW;
  const xOverR = type.xOverR ?? t.xOverR ?? impliedXOverR;
  if (xOverR !== undefined) next.xOverR = xOverR;
  return next;
}

export function applyConductorType(line: Line, conductor: ConductorType, frequencyHz: 50 | 60): { line: Line; note?: string } {
  const values = conductorAtFrequency(conductor, frequencyHz);
  // The construction follows the type: a cable picked for an overhead line makes it a cable.
  const next: Line = { ...line, kind: conductor.kind, rOhmPerKm: values.rOhmPerKm, xOhmPerKm: values.xOhmPerKm, ampacityA: values.ampacityA };
  if (values.bMicroSiemensPerKm !== undefined) next.bMicroSiemensPerKm = values.bMicroSiemensPerKm;
  return { line: next, note: values.note };
}
