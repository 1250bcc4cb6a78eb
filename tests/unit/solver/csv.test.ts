// RFC 4180 output: quoting, CRLF line ends, units in the header.
import { describe, expect, it } from "vitest";
import { branchesCsv, busesCsv, csvField, sourcesCsv, toCsv } from "#solver/csv.ts";
import { solveNetwork } from "#solver/index.ts";
import type { NetworkInput } from "#solver/schema.ts";
import { fixture } from "./fixtures.ts";

/** A small RFC 4180 reader, only to read back what the writer wrote. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = "";
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ",") {
      row.push(field);
      field = "";
    } else if (ch === "\r" && text[i + 1] === "\n") {
      row.push(field);
      rows.push(row);
      row = [];
      field = "";
      i++;
    } else field += ch;
  }
  return rows;
}

describe("csv fields (RFC 4180)", () => {
  it("quotes fields with a comma, a quote or a line break, doubling inner quotes", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(csvField(null)).toBe("");
    expect(csvField(-1.5)).toBe("-1.5");
  });
  it("defuses text a spreadsheet would run as a formula", () => {
    expect(csvField("=SUM(A1)")).toBe("'=SUM(A1)");
    expect(csvField("@cmd")).toBe("'@cmd");
  });
  it("ends every record with CRLF and reads back to the same cells", () => {
    const text = toCsv(["a", "b"], [["x, y", 'q"uote'], ["line\nbreak", 3]]);
    expect(text.endsWith("\r\n")).toBe(true);
    expect(parseCsv(text)).toEqual([["a", "b"], ["x, y", 'q"uote'], ["line\nbreak", "3"]]);
  });
});

describe("result tables", () => {
  const doc = structuredClone(fixture("ring-brackenwold.json").document) as NetworkInput;
  doc.buses[2].name = 'Ling Cross, "north" 33 kV';
  const outcome = solveNetwork(doc);
  if (!outcome.ok) throw new Error("fixture invalid");
  const { network, result } = outcome;

  it("buses: one row per bus with units in the header, values as solved", () => {
    const rows = parseCsv(busesCsv(network, result));
    expect(rows[0]).toEqual(["bus_id", "bus_name", "nominal_kV", "voltage_pu", "voltage_kV", "angle_deg", "ik3_kA", "sk3_MVA", "ip3_kA", "ik1_kA", "r_over_x", "fault_note", "ik3min_kA", "sk3min_MVA", "ik1min_kA", "min_fault_asked_MVA", "ip_method"]);
    expect(rows).toHaveLength(network.buses.length + 1);
    expect(rows[3][1]).toBe('Ling Cross, "north" 33 kV');
    // Six significant figures (the CSV's precision): within half a unit of the sixth figure.
    expect(Math.abs(Number(rows[3][3]) - result.loadFlow.buses[2].vPu)).toBeLessThanOrEqual(5e-6);
  });

  it("buses without fault levels leave those columns out", () => {
    const plain = solveNetwork(doc, { faults: false });
    if (!plain.ok) throw new Error("fixture invalid");
    expect(parseCsv(busesCsv(plain.network, plain.result))[0]).toHaveLength(6);
  });

  it("branches: one row per line and transformer with MW, Mvar, kW, A and % in the header", () => {
    const rows = parseCsv(branchesCsv(network, result));
    expect(rows[0]).toEqual(["branch_id", "branch_name", "kind", "from_bus", "to_bus", "p_from_MW", "q_from_Mvar", "p_to_MW", "q_to_Mvar", "loss_kW", "current_A", "loading_pct", "current_from_A", "current_to_A", "tap_pct", "tap_changer"]);
    expect(rows).toHaveLength(network.lines.length + network.transformers.length + 1);
    const transformerRow = rows.find((r) => r[0] === "t-wold")!;
    expect(transformerRow[2]).toBe("transformer");
    const loss = result.loadFlow.branches.find((b) => b.id === "t-wold")!.lossKW;
    expect(Math.abs(Number(transformerRow[9]) - loss)).toBeLessThanOrEqual(Math.abs(loss) * 5e-6);
  });

  it("writes every number with at most six significant figures, never binary noise such as 11.440000000000001", () => {
    for (const text of [busesCsv(network, result), branchesCsv(network, result)]) {
      const numbers = parseCsv(text).slice(1).flat().filter((cell) => cell !== "" && Number.isFinite(Number(cell)));
      expect(numbers.length).toBeGreaterThan(10);
      for (const cell of numbers) expect(cell.replace(/^-/, "").replace(".", "").replace(/^0+/, "").length).toBeLessThanOrEqual(6);
    }
  });

  it("gives a transformer's current at each winding: I = |S| / (√3 U) at that side (the three-phase power formula)", () => {
    const rows = parseCsv(branchesCsv(network, result));
    const header = rows[0];
    const row = rows.find((r) => r[0] === "t-wold")!;
    const reading = result.loadFlow.branches.find((b) => b.id === "t-wold")!;
    const vKV = (id: string) => result.loadFlow.buses.find((b) => b.id === id)!.vKV;
    const hv = (Math.hypot(reading.pFromMW, reading.qFromMvar) / (Math.sqrt(3) * vKV(reading.fromBus))) * 1000;
    const lv = (Math.hypot(reading.pToMW, reading.qToMvar) / (Math.sqrt(3) * vKV(reading.toBus))) * 1000;
    expect(Number(row[header.indexOf("current_from_A")])).toBeCloseTo(hv, 2);
    expect(Number(row[header.indexOf("current_to_A")])).toBeCloseTo(lv, 2);
    // The larger of the two is the solver's own branch current.
    expect(Math.max(hv, lv)).toBeCloseTo(reading.currentA, 1);
  });
});

describe("version 2 readings in the CSV: minimum fault levels, regulating taps and converter plants", () => {
  const solar = solveNetwork(fixture("hollin-moor-solar.json").document);
  const tarn = solveNetwork(fixture("tarn-head-calder-flats.json").document);
  if (!solar.ok || !tarn.ok) throw new Error("demo invalid");
  const table = (text: string) => {
    const [header, ...rows] = parseCsv(text);
    return rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i]])));
  };

  it("gives S″k3min = √3 · U_n · I″k3min at every bus (the three-phase power formula) and names the peak method", () => {
    const buses = table(busesCsv(solar.network, solar.result));
    for (const row of buses) {
      const un = Number(row.nominal_kV);
      expect(Number(row.sk3min_MVA)).toBeCloseTo(Math.sqrt(3) * un * Number(row.ik3min_kA), 0);
      // The minimum case (c_min, weakest infeed, hot conductors, no converters) is below the maximum.
      expect(Number(row.ik3min_kA)).toBeLessThan(Number(row.ik3_kA));
      expect(row.ip_method).not.toBe("");
    }
  });

  it("gives each converter plant's output and its short-circuit ratio S″k3min / rated MVA (its definition), the grid infeed none", () => {
    const sources = table(sourcesCsv(solar.network, solar.result));
    const plant = sources.find((r) => r.kind === "converter plant")!;
    const drawn = solar.network.sources.find((s) => s.id === plant.source_id)!;
    const bus = table(busesCsv(solar.network, solar.result)).find((r) => r.bus_id === plant.bus)!;
    expect(Number(plant.scr)).toBeCloseTo(Number(bus.sk3min_MVA) / drawn.ratedMVA!, 2);
    expect(Number(plant.p_MW)).toBeCloseTo(solar.result.loadFlow.sources.find((s) => s.id === drawn.id)!.pMW, 4);
    expect(Number(plant.scr_asked)).toBe(drawn.minShortCircuitRatio ?? 3);
    expect(sources.find((r) => r.kind === "grid infeed")!.scr).toBe("");
    expect(sources.find((r) => r.kind === "grid infeed")!.scr_asked).toBe("");
  });

  it("gives the regulating tap's position and says it regulates; a fixed tap reads as drawn with no word", () => {
    const branches = table(branchesCsv(tarn.network, tarn.result));
    const regulating = tarn.network.transformers.find((t) => t.tapControl)!;
    const row = branches.find((r) => r.branch_id === regulating.id)!;
    expect(row.tap_changer).toMatch(/^regulating/);
    expect(Number(row.tap_pct)).toBe(tarn.result.loadFlow.branches.find((b) => b.id === regulating.id)!.tapPct);
    const fixedTap = tarn.network.transformers.find((t) => !t.tapControl)!;
    const fixedRow = branches.find((r) => r.branch_id === fixedTap.id)!;
    expect(fixedRow.tap_changer).toBe("");
    expect(Number(fixedRow.tap_pct)).toBe(fixedTap.tapPct);
    expect(branches.find((r) => r.kind === "line")!.tap_pct).toBe("");
  });
});
