// A team's own equipment types: transformers and conductors it buys, with the makers' data. The
// schemas here check one type on its own (the library page, the CSV import and the API share
// them); `toTransformerType` and `toConductorType` turn a saved type into the shapes the built-in
// library offers, so the sheet's Details form lists both alike.
import { z } from "zod";
import { vectorGroupPattern } from "#solver/schema.ts";
import type { ConductorType, TransformerType } from "./equipmentLibrary.ts";

export const libraryTypeKinds = ["transformer", "conductor"] as const;
export type LibraryTypeKind = (typeof libraryTypeKinds)[number];

const finite = z.number().finite();
const positive = finite.positive("must be above 0");
const nonNegative = finite.nonnegative("must not be negative");

export const libraryTypeNameSchema = z
  .string()
  .trim()
  .min(1, "a type needs a name")
  .max(200, "a name may have at most 200 characters");

/**
 * Star against delta or zigzag shifts by an odd clock number; like windings, and delta against
 * zigzag, by an even one (IEC 60076-1). Returns a sentence when the group cannot exist.
 */
export function vectorGroupProblem(vectorGroup: string): string | null {
  const group = vectorGroupPattern.exec(vectorGroup);
  if (!group) return `"${vectorGroup}" is not an IEC 60076-1 vector group such as YNd11, Dyn11 or YNyn0`;
  const clock = Number(group[3]);
  if (clock > 11) return `clock number ${clock} must be 0 to 11`;
  const hvKind = group[1][0];
  const lvKind = group[2][0].toUpperCase();
  const mixed = hvKind !== lvKind && (hvKind === "Y" || lvKind === "Y");
  if ((clock % 2 === 1) !== mixed) return `${vectorGroup} is not a possible vector group (clock number ${clock} does not fit these windings)`;
  return null;
}

export const transformerTypeDataSchema = z
  .strictObject({
    ratedMVA: positive,
    hvKV: positive,
    lvKV: positive,
    /** Short-circuit impedance u_k on the type's own rating. */
    impedancePct: positive.max(100, "must be below 100 %"),
    loadLossKW: nonNegative.optional(),
    noLoadLossKW: nonNegative.optional(),
    xOverR: positive.optional(),
    vectorGroup: z.string().trim().optional(),
  })
  .superRefine((t, ctx) => {
    if (t.lvKV >= t.hvKV)
      ctx.addIssue({ code: "custom", path: ["lvKV"], message: `LV ${t.lvKV} kV must be below HV ${t.hvKV} kV` });
    // The copper loss sets R = P_k / S_r in per unit, which cannot exceed the impedance u_k.
    if (t.loadLossKW !== undefined && t.loadLossKW / (t.ratedMVA * 1000) >= t.impedancePct / 100)
      ctx.addIssue({
        code: "custom",
        path: ["loadLossKW"],
        message: `${t.loadLossKW} kW at ${t.ratedMVA} MVA gives a resistance above the impedance ${t.impedancePct} %`,
      });
    if (t.vectorGroup !== undefined && t.vectorGroup !== "") {
      const problem = vectorGroupProblem(t.vectorGroup);
      if (problem) ctx.addIssue({ code: "custom", path: ["vectorGroup"], message: problem });
    }
  });

export const conductorTypeDataSchema = z
  .strictObject({
    kind: z.enum(["overhead", "cable"], "must be overhead or cable"),
    /** The frequency the impedances were given for; X and B scale with it. */
    frequencyHz: z.union([z.literal(50), z.literal(60)], "must be 50 or 60"),
    rOhmPerKm: nonNegative,
    xOhmPerKm: nonNegative,
    bMicroSiemensPerKm: nonNegative.optional(),
    ampacityA: positive,
    /** For the adiabatic fault withstand when sizing a conductor. */
    material: z.enum(["copper", "aluminium", "acsr"], "must be copper, aluminium or acsr").optional(),
    crossSectionMm2: positive.max(5000, "must be at most 5000 mm²").optional(),
    /** Cables: the system voltage the insulation is made for; sizing offers the cable at that voltage only. */
    nominalKV: positive.max(1500, "must be at most 1500 kV").optional(),
    /** Where the numbers come from: a maker's datasheet, a standard, or "from memory". */
    source: z.string().trim().max(200, "must be at most 200 characters").optional(),
  })
  .superRefine((c, ctx) => {
    if (c.rOhmPerKm === 0 && c.xOhmPerKm === 0)
      ctx.addIssue({ code: "custom", path: ["xOhmPerKm"], message: "R and X are both 0; a conductor needs an impedance" });
  });

export type TransformerTypeData = z.output<typeof transformerTypeDataSchema>;
export type ConductorTypeData = z.output<typeof conductorTypeDataSchema>;

export const libraryTypeSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("transformer"), name: libraryTypeNameSchema, data: transformerTypeDataSchema }),
  z.strictObject({ kind: z.literal("conductor"), name: libraryTypeNameSchema, data: conductorTypeDataSchema }),
]);
export type LibraryTypeInput = z.output<typeof libraryTypeSchema>;

/** A saved type as the library table holds it. */
export interface SavedLibraryType {
  id: number;
  kind: LibraryTypeKind;
  name: string;
  data: TransformerTypeData | ConductorTypeData;
}

/** A team's transformer type in the built-in library's shape, plus what the team knows besides. */
export interface TeamTransformerType extends TransformerType {
  hvKV: number;
  lvKV: number;
  vectorGroup?: string;
}

export interface TeamConductorType extends ConductorType {
  kind: "overhead" | "cable";
}

/** Ids of team types never collide with the built-in ones ("iec-…", "acsr-…"). */
export function teamTypeId(id: number): string {
  return `team-${id}`;
}

export function toTransformerType(id: number, name: string, data: TransformerTypeData, teamName: string): TeamTransformerType {
  return {
    id: teamTypeId(id),
    label: name,
    ratedMVA: data.ratedMVA,
    impedancePct: data.impedancePct,
    loadLossKW: data.loadLossKW,
    noLoadLossKW: data.noLoadLossKW,
    xOverR: data.xOverR,
    hvKV: data.hvKV,
    lvKV: data.lvKV,
    vectorGroup: data.vectorGroup || undefined,
    source: `${teamName} library`,
  };
}

export function toConductorType(id: number, name: string, data: ConductorTypeData, teamName: string): TeamConductorType {
  return {
    id: teamTypeId(id),
    label: name,
    kind: data.kind,
    frequencyHz: data.frequencyHz,
    rOhmPerKm: data.rOhmPerKm,
    xOhmPerKm: data.xOhmPerKm,
    ampacityA: data.ampacityA,
    bMicroSiemensPerKm: data.bMicroSiemensPerKm,
    material: data.material,
    crossSectionMm2: data.crossSectionMm2,
    nominalKV: data.nominalKV,
    source: data.source ? `${teamName} library: ${data.source}` : `${teamName} library`,
  };
}
