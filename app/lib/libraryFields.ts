// The library page's type form: which fields each kind of type has and in which unit. Kept apart
// from the reading of the form so the page does not load the unit parser into the browser.
import type { LibraryTypeKind } from "./libraryTypes.ts";
import type { QuantityKind } from "./units.ts";
import { FIELD_CATALOGUE, type CatalogueKey } from "./fieldCatalogue.ts";

export interface LibraryField {
  name: string;
  label: string;
  kind?: QuantityKind;
  optional?: boolean;
  choices?: readonly string[];
  hint?: string;
  /** A plain number typed without a unit (a cross-section in mm²). */
  number?: boolean;
}

/** A quantity field labelled and unit-ed as the network file's field of the same name. */
function quantity(name: CatalogueKey, options: Pick<LibraryField, "optional" | "hint"> = {}): LibraryField {
  const entry: { label: string; quantity?: QuantityKind } = FIELD_CATALOGUE[name];
  return { name, label: entry.label, kind: entry.quantity, ...options };
}

export const libraryFields: Record<LibraryTypeKind, LibraryField[]> = {
  transformer: [
    quantity("ratedMVA", { hint: "e.g. 25 MVA or 630 kVA" }),
    quantity("hvKV"),
    quantity("lvKV"),
    quantity("impedancePct"),
    quantity("loadLossKW", { optional: true }),
    quantity("noLoadLossKW", { optional: true }),
    quantity("xOverR", { optional: true, hint: "used when the load loss is not given" }),
    { name: "vectorGroup", label: "Vector group", optional: true, hint: "e.g. YNd11, Dyn11" },
  ],
  conductor: [
    { name: "kind", label: "Construction", choices: ["overhead", "cable"] },
    { name: "frequencyHz", label: "Impedances given at", choices: ["50", "60"], hint: "Hz" },
    quantity("rOhmPerKm"),
    quantity("xOhmPerKm"),
    quantity("bMicroSiemensPerKm", { optional: true }),
    quantity("ampacityA"),
    { name: "material", label: "Conductor material", choices: ["copper", "aluminium", "acsr"], optional: true, hint: "with the cross-section, lets sizing check fault withstand" },
    { name: "crossSectionMm2", label: "Cross-section (mm²)", number: true, optional: true, hint: "aluminium area for ACSR" },
    { ...quantity("nominalKV", { optional: true, hint: "cables: the system voltage it is made for" }), label: "Cable system voltage" },
    { name: "source", label: "Source of the values", optional: true, hint: "maker's datasheet, a standard, or “from memory”" },
  ],
};
