import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  canonicalRequest,
  conductorOptions,
  defaultSectionBus,
  draftForSection,
  draftFromRequest,
  moveToSection,
  readCandidateVoltage,
  readNumber,
  requestFromDraft,
  toggleVoltage,
  voltageKey,
  type StudyDraft,
} from "#app/components/ladder/studyDraft.ts";
import { moneyInputSchema } from "#solver/economics.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";
import { findSection } from "#solver/section.ts";
import { chainNetwork } from "../../../largeNetworks.ts";

function tarnHead(): Network {
  const checked = validateNetwork(JSON.parse(readFileSync(new URL("../../../../fixtures/tarn-head-calder-flats.json", import.meta.url), "utf8")));
  if (!checked.ok) throw new Error("fixture invalid");
  return checked.network;
}

const network = tarnHead();

function withAlternative(draft: StudyDraft, voltageKV: number, patch: Partial<StudyDraft["alternatives"][string]>): StudyDraft {
  const key = voltageKey(voltageKV);
  return { ...draft, alternatives: { ...draft.alternatives, [key]: { ...draft.alternatives[key], ...patch } } };
}

describe("a new study on the 66 kV link", () => {
  const draft = draftForSection(network, "b-calder-66");

  // IEC 60038 series I preferred values next to 66 kV are 33 and 110 kV (methods, check values).
  it("starts with the present voltage and its IEC 60038 neighbours", () => {
    expect(draft.voltagesKV).toEqual([33, 66, 110]);
    expect(Object.keys(draft.alternatives)).toEqual(["33", "66", "110"]);
  });

  it("asks for the money defaults a planner recognises and nothing else", () => {
    const { request, errors } = requestFromDraft(draft, network);
    expect(errors).toEqual({});
    expect(request).toEqual({ sectionBus: "b-calder-66", voltagesKV: [33, 66, 110], money: moneyInputSchema.parse({}) });
  });

  it("keeps its voltages when another bus of the same section is picked, and starts afresh on another section", () => {
    expect(moveToSection(draft, network, "b-tarn-66")).toMatchObject({ sectionBus: "b-tarn-66", voltagesKV: [33, 66, 110] });
    // The 11 kV section at Calder Flats: 6.6, 11 and 22 kV are its series I neighbours.
    expect(moveToSection(draft, network, "b-town")).toMatchObject({ sectionBus: "b-town", voltagesKV: [6.6, 11, 22] });
  });

  it("adds and removes voltages in ascending order", () => {
    const ladder = toggleVoltage(toggleVoltage(draft, 110), 132);
    expect(ladder.voltagesKV).toEqual([33, 66, 132]);
    expect(Object.keys(ladder.alternatives).sort()).toEqual(["132", "33", "66"]);
  });
});

describe("per-alternative inputs in the request", () => {
  const base = toggleVoltage(toggleVoltage(draftForSection(network, "b-calder-66"), 110), 132);

  it("reads taps, line cost and capital as planners type them, in the order of the voltages", () => {
    const draft = withAlternative(base, 132, { taps: { "t-calder": "+2.5 %" }, lineCostPerKm: "240,000", capitalCost: "9 000 000" });
    const { request, errors } = requestFromDraft(draft, network);
    expect(errors).toEqual({});
    expect(request.overrides).toEqual([null, null, { transformers: { "t-calder": { tapPct: 2.5 } }, capital: { lineCostPerKm: 240000, capitalCost: 9000000 } }]);
  });

  // Methods, ACSR check values: Dove is 0.351 Ω/km at 60 Hz; at 50 Hz X scales by 5/6 to 0.2925 Ω/km, R is kept.
  it("puts the chosen library conductor on the section at the network's frequency", () => {
    const dove = conductorOptions(50).find((o) => o.id === "acsr-dove")!;
    expect(dove.conductor.xOhmPerKm).toBeCloseTo(0.2925, 6);
    const { request } = requestFromDraft(withAlternative(base, 33, { conductorId: "acsr-dove" }), network);
    expect(request.overrides?.[0]).toEqual({ conductor: { name: "ACSR Dove 556.5 kcmil 26/7", rOhmPerKm: 0.1156, xOhmPerKm: 0.2925, ampacityA: 730 } });
  });

  it("names the field of every number it cannot read or the schema refuses", () => {
    let draft = withAlternative(base, 66, { taps: { "t-tarn": "two" }, capitalCost: "-5" });
    draft = { ...draft, money: { ...draft.money, text: { ...draft.money.text, loadFactor: "0,6", studyYears: "2.5", energyPricePerMWh: "" } } };
    const { errors } = requestFromDraft(draft, network);
    expect(errors).toEqual({
      "overrides[1].transformers.t-tarn.tapPct": '"two" is not a number',
      "overrides[1].capital.capitalCost": "must be 0 or more",
      "money.loadFactor": "use a point for decimals, e.g. 0.6",
      "money.studyYears": "must be a whole number of years",
      "money.energyPricePerMWh": "is required",
    });
  });

  it("shows a saved request again as it was asked, whatever order its voltages were in", () => {
    const draft = withAlternative(withAlternative(base, 132, { taps: { "t-calder": "2.5" }, capitalCost: "9000000" }), 33, { conductorId: "acsr-falcon" });
    const { request } = requestFromDraft(draft, network);
    const again = draftFromRequest(network, request);
    expect(canonicalRequest(requestFromDraft(again, network).request)).toBe(canonicalRequest(request));
    // Asked in another order, the form shows the voltages ascending with their own inputs.
    const reversed = draftFromRequest(network, { ...request, voltagesKV: [132, 66, 33], overrides: [...request.overrides!].reverse() });
    expect(reversed.voltagesKV).toEqual([33, 66, 132]);
    expect(reversed.alternatives["132"].capitalCost).toBe("9000000");
    expect(reversed.alternatives["33"].conductorId).toBe("acsr-falcon");
  });

  it("keeps overrides the form does not show when a saved request comes back", () => {
    const request = { sectionBus: "b-calder-66", voltagesKV: [66], overrides: [{ loads: { "ld-mine": { pMW: 10 } }, transformers: { "t-calder": { tapPct: 1.25, impedancePct: 9 } } }] };
    const { request: again } = requestFromDraft(draftFromRequest(network, request), network);
    expect(again.overrides).toEqual([{ loads: { "ld-mine": { pMW: 10 } }, transformers: { "t-calder": { impedancePct: 9, tapPct: 1.25 } } }]);
  });
});

describe("typed values", () => {
  it("reads a free candidate voltage in kV or volts, and says why one cannot join", () => {
    expect(readCandidateVoltage("88", [33, 66])).toEqual({ ok: true, voltageKV: 88 });
    expect(readCandidateVoltage("88 kV", [33, 66])).toEqual({ ok: true, voltageKV: 88 });
    expect(readCandidateVoltage("88000 V", [33, 66])).toEqual({ ok: true, voltageKV: 88 });
    expect(readCandidateVoltage("66", [33, 66])).toEqual({ ok: false, error: "66 kV is already in the ladder." });
    expect(readCandidateVoltage("33000", [])).toEqual({ ok: false, error: "33000 kV is above 1200 kV; enter kilovolts (33, not 33000)." });
    expect(readCandidateVoltage("0", [])).toEqual({ ok: false, error: "The voltage must be above 0 kV." });
    expect(readCandidateVoltage("", []).ok).toBe(false);
    expect(readCandidateVoltage("20 MW", [])).toMatchObject({ ok: false, error: expect.stringMatching(/voltage/) });
    expect(readCandidateVoltage("400", Array.from({ length: 12 }, (_, i) => i + 1))).toMatchObject({ ok: false, error: expect.stringMatching(/at most 12/) });
  });

  it("reads numbers with thousands separators, a minus sign or a percent sign where one fits", () => {
    expect(readNumber("7,540,000")).toEqual({ ok: true, value: 7540000 });
    expect(readNumber("−7.5", true)).toEqual({ ok: true, value: -7.5 });
    expect(readNumber("8 %", true)).toEqual({ ok: true, value: 8 });
    expect(readNumber("8 %").ok).toBe(false);
    expect(readNumber("1e3")).toEqual({ ok: true, value: 1000 });
  });

  it("compares requests by what they ask, not by how their keys are ordered", () => {
    const a = { sectionBus: "b-tarn-66", voltagesKV: [66], money: { currency: "GBP", loadFactor: 0.5 } };
    const b = { money: { loadFactor: 0.5, currency: "GBP" }, voltagesKV: [66], sectionBus: "b-tarn-66" };
    expect(canonicalRequest(a)).toBe(canonicalRequest(b));
    expect(canonicalRequest({ ...a, voltagesKV: [66, 132] })).not.toBe(canonicalRequest(a));
    expect(canonicalRequest({ sectionBus: "" })).toBeUndefined();
  });
});

describe("the section offered first", () => {
  /** The definition, one section search per line: quadratic, so only for small networks. */
  const byDefinition = (network: Network) =>
    network.lines.find((l) => (findSection(network, l.fromBus)?.facingWindings.length ?? 0) > 0)?.fromBus ?? network.lines[0]?.fromBus ?? network.buses[0].id;

  it.each(["tarn-head-calder-flats.json", "hollin-moor-solar.json"])("%s: the first line's section that meets a transformer", (file) => {
    const network = JSON.parse(readFileSync(`tests/fixtures/${file}`, "utf8"));
    const checked = validateNetwork(network);
    if (!checked.ok) throw new Error(file);
    expect(defaultSectionBus(checked.network)).toBe(byDefinition(checked.network));
  });

  it("is found in one pass on a 50,000-bus chain behind a separate two-bus link", { timeout: 300_000 }, () => {
    const chain = chainNetwork(50_000);
    const network: Network = {
      ...chain,
      buses: [...chain.buses, { id: "c0", name: "C0", nominalKV: 11, vMinPu: 0.9, vMaxPu: 1.1 }, { id: "c1", name: "C1", nominalKV: 11, vMinPu: 0.9, vMaxPu: 1.1 }, { id: "lv", name: "LV", nominalKV: 0.4, vMinPu: 0.9, vMaxPu: 1.1 }],
      lines: [{ ...chain.lines[0], id: "link", fromBus: "c0", toBus: "c1" }, ...chain.lines],
      transformers: [{ id: "t", name: "T", hvBus: "b49999", lvBus: "lv", ratedMVA: 1, hvKV: 11, lvKV: 0.4, impedancePct: 6, tapPct: 0, vectorGroup: "Dyn11" }],
    };
    expect(defaultSectionBus(network)).toBe("b0");
  });
});

describe("requiring N-1 in the ladder", () => {
  it("asks for outages only when ticked, keeps the tick through a move to another section and a saved request", () => {
    const plain = draftForSection(network, "b-calder-66");
    expect(plain.outages).toBe(false);
    expect(requestFromDraft(plain, network).request).not.toHaveProperty("outages");
    const n1 = { ...plain, outages: true };
    const { request, errors } = requestFromDraft(n1, network);
    expect(errors).toEqual({});
    expect(request.outages).toBe(true);
    expect(draftFromRequest(network, request).outages).toBe(true);
    expect(moveToSection(n1, network, "b-town").outages).toBe(true);
  });
});

describe("sizing the section's conductor in the ladder", () => {
  it("asks for sizing only when ticked, reads the clearing time, names a wrong one and keeps the choice through a saved request and a move", () => {
    const plain = draftForSection(network, "b-calder-66");
    expect(plain.sizing).toEqual({ on: false, clearingTimeS: "0.5" });
    expect(requestFromDraft(plain, network).request).not.toHaveProperty("sizing");
    const sized = { ...plain, sizing: { on: true, clearingTimeS: "0.8" } };
    const { request, errors } = requestFromDraft(sized, network);
    expect(errors).toEqual({});
    expect(request.sizing).toEqual({ clearingTimeS: 0.8 });
    expect(draftFromRequest(network, request).sizing).toEqual({ on: true, clearingTimeS: "0.8" });
    expect(moveToSection(sized, network, "b-town").sizing).toEqual(sized.sizing);
    expect(requestFromDraft({ ...plain, sizing: { on: true, clearingTimeS: "half" } }, network).errors["sizing.clearingTimeS"]).toBe('"half" is not a number');
    expect(requestFromDraft({ ...plain, sizing: { on: true, clearingTimeS: "0" } }, network).errors["sizing.clearingTimeS"]).toBe("must be a time above 0 s");
  });
});
