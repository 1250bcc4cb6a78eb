// The library types a line could be built with, as candidates for sizing: every overhead conductor,
// and the cables made for the line's voltage, each at the network's frequency. Types that do not
// say their material and cross-section cannot be checked for fault withstand and are left out.
import type { SizingCandidate } from "#solver/conductorSizing.ts";
import type { ConductorLibrary } from "#solver/ladder.ts";
import type { Line } from "#solver/schema.ts";
import { builtInConductorTypes, conductorAtFrequency, type ConductorType } from "./equipmentLibrary.ts";

export function sizingCandidates(types: readonly ConductorType[], nominalKV: number, frequencyHz: 50 | 60): SizingCandidate[] {
  return types.flatMap((type) => {
    if (type.material === undefined || type.crossSectionMm2 === undefined) return [];
    if (type.kind === "cable" && type.nominalKV !== undefined && Math.abs(type.nominalKV - nominalKV) > 1e-9) return [];
    const values = conductorAtFrequency(type, frequencyHz);
    return [
      {
        id: type.id,
        label: type.label,
        kind: type.kind,
        material: type.material,
        crossSectionMm2: type.crossSectionMm2,
        rOhmPerKm: values.rOhmPerKm,
        xOhmPerKm: values.xOhmPerKm,
        bMicroSiemensPerKm: values.bMicroSiemensPerKm,
        ampacityA: values.ampacityA,
      },
    ];
  });
}

/** The line's nominal voltage: its from-bus's. */
export function lineNominalKV(line: Line, buses: readonly { id: string; nominalKV: number }[]): number {
  return buses.find((b) => b.id === line.fromBus)?.nominalKV ?? buses.find((b) => b.id === line.toBus)?.nominalKV ?? 0;
}

/** The library the voltage ladder sizes each alternative's section from: the built-in types and the team's own. */
export function ladderConductors(teamTypes: readonly ConductorType[] = []): ConductorLibrary {
  const types = [...builtInConductorTypes, ...teamTypes];
  return (nominalKV, frequencyHz) => sizingCandidates(types, nominalKV, frequencyHz);
}

/** The built-in library alone, for callers without a team (the command line, tests). */
export const builtInLadderConductors: ConductorLibrary = ladderConductors();
