// Starting points for a new network: a blank one that still validates, and the two demo studies.
// The seed uses the same documents, so the demo team and "create from a template" agree.
import hollinMoorSolar from "./hollinMoorSolar.json";
import tarnHeadCalderFlats from "./tarnHeadCalderFlats.json";
import { validateNetwork, type Network, type NetworkInput } from "#solver/schema.ts";

/** The smallest document that validates: one busbar fed by a grid infeed that is the slack. */
function blankNetwork(name: string): NetworkInput {
  return {
    format: "kilostep.network",
    version: 1,
    name,
    frequencyHz: 50,
    baseMVA: 100,
    buses: [{ id: "b-1", name: "Busbar 1", nominalKV: 33, x: 0, y: 0 }],
    sources: [
      {
        id: "g-1",
        name: "Grid infeed",
        bus: "b-1",
        kind: "grid",
        control: "slack",
        voltagePu: 1,
        angleDeg: 0,
        shortCircuitMVA: 1000,
        xOverR: 10,
      },
    ],
    transformers: [],
    lines: [],
    loads: [],
    shunts: [],
  };
}

export const TEMPLATE_IDS = ["blank", "tarn-head-calder-flats", "hollin-moor-solar"] as const;
export type TemplateId = (typeof TEMPLATE_IDS)[number];

export const TEMPLATES: { id: TemplateId; label: string; hint: string; defaultName: string }[] = [
  {
    id: "blank",
    label: "Blank",
    hint: "One 33 kV busbar with a grid infeed, ready to build on.",
    defaultName: "New network",
  },
  {
    id: "tarn-head-calder-flats",
    label: "Demo: Tarn Head to Calder Flats",
    hint: "24 MVA hydro at 11 kV, 48 km of 66 kV line, a mine and a town (fictional).",
    defaultName: tarnHeadCalderFlats.name,
  },
  {
    id: "hollin-moor-solar",
    label: "Demo: Hollin Moor solar export",
    hint: "40 MW solar park exporting through 33/132 kV into a 3,000 MVA grid (fictional).",
    defaultName: hollinMoorSolar.name,
  },
];

export const DEMO_DOCUMENTS: readonly unknown[] = [tarnHeadCalderFlats, hollinMoorSolar];

/** The template's document under the chosen name, validated (the templates always are). */
export function documentFromTemplate(id: TemplateId, name?: string): Network {
  const template = TEMPLATES.find((t) => t.id === id)!;
  const chosenName = name?.trim() || template.defaultName;
  const source =
    id === "blank" ? blankNetwork(chosenName) : { ...(id === "tarn-head-calder-flats" ? tarnHeadCalderFlats : hollinMoorSolar), name: chosenName };
  const checked = validateNetwork(source);
  if (!checked.ok) {
    throw new Error(`The ${id} template does not validate: ${checked.issues.map((i) => `${i.path} ${i.message}`).join("; ")}`);
  }
  return checked.network;
}
