// RFC 4180 output: quoting, CRLF line ends, units in the header.
import { describe, expect, it } from "vitest";
import { branchesCsv, busesCsv, csvField, toCsv } from "#solver/csv.ts";
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
    expect(rows[0]).toEqual(["bus_id", "bus_name", "nominal_kV", "voltage_pu", "voltage_kV", "angle_deg", "ik3_kA", "sk3_MVA", "ip3_kA", "ik1_kA", "r_over_x", "fault_note"]);
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
    expect(rows[0]).toEqual(["branch_id", "branch_name", "kind", "from_bus", "to_bus", "p_from_MW", "q_from_Mvar", "p_to_MW", "q_to_Mvar", "loss_kW", "current_A", "loading_pct", "current_from_A", "current_to_A"]);
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
