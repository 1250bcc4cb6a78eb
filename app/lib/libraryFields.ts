// The library page's type form: which fields each kind of type has and in which unit. Kept apart
// from the reading of the form so the page does not load the unit parser into the browser.
import type { LibraryTypeKind } from "./libraryTypes.ts";
import type { QuantityKind } from "./units.ts";

export interface LibraryField {
  name: string;
  label: string;
  kind?: QuantityKind;
  optional?: boolean;
  choices?: readonly string[];
  hint?: string;
}

export const libraryFields: Record<LibraryTypeKind, LibraryField[]> = {
  transformer: [
    { name: "ratedMVA", label: "Rated power", kind: "MVA", hint: "e.g. 25 MVA or 630 kVA" },
    { name: "hvKV", label: "HV winding", kind: "kV" },
    { name: "lvKV", label: "LV winding", kind: "kV" },
    { name: "impedancePct", label: "Impedance u_k", kind: "pct" },
    { name: "loadLossKW", label: "Load (copper) loss", kind: "kW", optional: true },
    { name: "noLoadLossKW", label: "No-load (core) loss", kind: "kW", optional: true },
    { name: "xOverR", label: "X/R", kind: "ratio", optional: true, hint: "used when the load loss is not given" },
    { name: "vectorGroup", label: "Vector group", optional: true, hint: "e.g. YNd11, Dyn11" },
  ],
  conductor: [
    { name: "kind", label: "Construction", choices: ["overhead", "cable"] },
    { name: "frequencyHz", label: "Impedances given at", choices: ["50", "60"], hint: "Hz" },
    { name: "rOhmPerKm", label: "Resistance R", kind: "ohmPerKm" },
    { name: "xOhmPerKm", label: "Reactance X", kind: "ohmPerKm" },
    { name: "bMicroSiemensPerKm", label: "Susceptance B", kind: "microSiemensPerKm", optional: true },
    { name: "ampacityA", label: "Ampacity", kind: "A" },
  ],
};
