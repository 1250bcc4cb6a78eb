import { readFileSync } from "node:fs";
import { join } from "node:path";
import { acos, tan } from "mathjs";

/** tan(arccos pf) by mathjs; a power factor in (0, 1] keeps arccos real. */
const tanPhi = (powerFactor: number) => tan(acos(powerFactor) as number);
import { describe, expect, it } from "vitest";
import { previewLoadsCsv, reactivePowerMvar, readPowerFactor } from "#app/lib/imports/loadsCsv.ts";
import { UPLOAD_LIMIT_BYTES } from "#app/lib/imports/uploadLimits.ts";
import { validateNetwork, type Network } from "#solver/schema.ts";

function tarnHead(): Network {
  const text = readFileSync(join(import.meta.dirname, "..", "..", "..", "..", "fixtures", "tarn-head-calder-flats.json"), "utf8");
  const validated = validateNetwork(JSON.parse(text));
  if (!validated.ok) throw new Error("fixture invalid");
  return validated.network;
}

function accepted(csv: string, network = tarnHead()) {
  const preview = previewLoadsCsv(csv, network);
  if (!preview.ok) throw new Error(`refused: ${preview.fileError ?? JSON.stringify(preview.rowErrors)}`);
  return preview;
}

function rowErrors(csv: string, network = tarnHead()) {
  const preview = previewLoadsCsv(csv, network);
  expect(preview.ok).toBe(false);
  expect(preview.network).toBeUndefined();
  return preview.rowErrors;
}

describe("loads CSV: good files", () => {
  it("adds new loads by bus id and by bus name, and updates an existing load by name", () => {
    const preview = accepted(
      [
        "bus,name,P (MW),Q (Mvar),model",
        "b-town,Calder Flats school,0.4,0.1,constant-current",
        "Sallow Rigg mine 11 kV,Mine workshop,0.25,0.08,",
        "b-town,Calder Flats town,7.5,2.5,",
      ].join("\n"),
    );
    expect(preview.changes.map((c) => [c.row, c.action, c.load.id, c.load.bus])).toEqual([
      [2, "new", "ld-calder-flats-school", "b-town"],
      [3, "new", "ld-mine-workshop", "b-mine"],
      [4, "update", "ld-town", "b-town"],
    ]);
    expect(preview.changes[0].load.model).toBe("constant-current");
    expect(preview.changes[2].previous?.pMW).toBe(7);
    const network = preview.network!;
    expect(network.loads).toHaveLength(4);
    expect(network.loads.find((l) => l.id === "ld-town")).toMatchObject({ pMW: 7.5, qMvar: 2.5, model: "constant-power" });
    expect(validateNetwork(network).ok).toBe(true);
  });

  it("reads units from the header and from the cell (1 MW = 1000 kW, SI prefixes)", () => {
    const preview = accepted(["bus,name,P (kW),Q [kvar]", "b-town,Shop,250,80", "b-town,Depot,1.2 MW,0.3 Mvar"].join("\n"));
    expect(preview.changes.map((c) => [c.load.pMW, c.load.qMvar])).toEqual([
      [0.25, 0.08],
      [1.2, 0.3],
    ]);
  });

  it("reads compact headers such as pMW, P_kW and QkVAr", () => {
    expect(accepted("bus,name,pMW,qMvar\nb-town,A,2,1").changes[0].load).toMatchObject({ pMW: 2, qMvar: 1 });
    expect(accepted("bus,name,P_kW,QkVAr\nb-town,A,500,100").changes[0].load).toMatchObject({ pMW: 0.5, qMvar: 0.1 });
  });

  it("derives Q from a power factor: Q = P·tan(arccos pf), lagging absorbs, leading supplies", () => {
    const preview = accepted(
      ["bus,name,P (MW),power factor", "b-mine,Crusher,9,0.85", "b-town,Pumps,4,0.8 lagging", "b-town,Filters,2,0.95 leading"].join("\n"),
    );
    const [crusher, pumps, filters] = preview.changes.map((c) => c.load.qMvar);
    // Independent check with mathjs's trigonometry.
    expect(crusher).toBeCloseTo(9 * tanPhi(0.85), 9);
    // A 0.8 power factor is the 3-4-5 triangle: Q/P = 0.6/0.8 = 0.75 exactly.
    expect(pumps).toBeCloseTo(3, 12);
    expect(filters).toBeCloseTo(-2 * tanPhi(0.95), 9);
    expect(preview.changes[0].note).toMatch(/power factor 0.85 lagging gives Q = 5.57/);
  });

  it("reads a semicolon file with decimal commas and a byte order mark, as spreadsheets in many locales save it", () => {
    const preview = accepted("\ufeffbus;name;P (MW);Q (Mvar)\r\nb-town;Bakery;0,35;0,12\r\n");
    expect(preview.delimiter).toBe(";");
    expect(preview.changes[0].load).toMatchObject({ name: "Bakery", pMW: 0.35, qMvar: 0.12 });
  });

  it("reads a tab-separated file", () => {
    expect(accepted("bus\tname\tP\tQ\nb-town\tMill\t1\t0.5").changes[0].load).toMatchObject({ pMW: 1, qMvar: 0.5 });
  });

  it("reads quoted fields holding commas, doubled quotes and a line break", () => {
    const preview = accepted('bus,name,P,Q\nb-town,"Works, east ""A""\nannex",1.5,0.4\nb-town,Plain,1,0.2');
    expect(preview.changes[0].load.name).toBe('Works, east "A"\nannex');
    // The quoted line break keeps the record one spreadsheet row.
    expect(preview.changes[1].row).toBe(3);
  });

  it("updates by id when the file has an id column, and keeps the name when the cell is blank", () => {
    const preview = accepted("id,bus,name,P,Q\nld-mine,b-mine,,10,4\nld-new-1,b-town,Cold store,0.5,0.2");
    expect(preview.changes[0]).toMatchObject({ action: "update", load: { id: "ld-mine", name: "Sallow Rigg mine", pMW: 10, qMvar: 4 } });
    expect(preview.changes[1]).toMatchObject({ action: "new", load: { id: "ld-new-1" } });
  });

  it("skips blank lines but counts them in row numbers", () => {
    const preview = previewLoadsCsv("bus,name,P,Q\n\nb-town,A,1,x\n", tarnHead());
    expect(preview.rowErrors).toEqual([{ row: 3, column: "Q", message: expect.stringMatching(/cannot read "x"/) }]);
  });

  it("lists columns it does not use", () => {
    expect(accepted("bus,name,P,Q,feeder\nb-town,A,1,0").ignoredColumns).toEqual(["feeder"]);
  });

  it("gives new loads unique ids even when names repeat existing ids", () => {
    const network = tarnHead();
    network.loads.push({ id: "ld-a", name: "Other", bus: "b-town", pMW: 1, qMvar: 0, model: "constant-power" });
    const preview = accepted("bus,name,P,Q\nb-town,A,1,0", network);
    expect(preview.changes[0].load.id).toBe("ld-a-2");
  });
});

describe("loads CSV: each kind of bad row names the row, the column and what is wrong", () => {
  it("an unknown bus", () => {
    expect(rowErrors("bus,name,P,Q\nb-nowhere,A,1,0")).toEqual([
      { row: 2, column: "bus", message: 'no bus has the id or name "b-nowhere"' },
    ]);
  });

  it("a bus name that two buses share", () => {
    const network = tarnHead();
    network.buses[5].name = "Calder Flats 11 kV";
    expect(rowErrors("bus,name,P,Q\nCalder Flats 11 kV,A,1,0", network)[0]).toMatchObject({
      row: 2,
      column: "bus",
      message: expect.stringMatching(/2 buses are named/),
    });
  });

  it("P that is missing, not a number, or in a unit that is not a power", () => {
    const errors = rowErrors("bus,name,P,Q\nb-town,A,,0\nb-town,B,lots,0\nb-town,C,5 kV,0");
    expect(errors.map((e) => [e.row, e.column])).toEqual([
      [2, "P"],
      [3, "P"],
      [4, "P"],
    ]);
    expect(errors[0].message).toBe("P is required");
    expect(errors[2].message).toMatch(/is not an active power/);
  });

  it("both Q and a power factor, or neither", () => {
    const errors = rowErrors("bus,name,P,Q,pf\nb-town,A,1,0.2,0.9\nb-town,B,1,,");
    expect(errors).toEqual([
      { row: 2, column: "Q", message: "give Q or a power factor, not both" },
      { row: 3, column: "Q", message: "give Q or a power factor" },
    ]);
  });

  it("a power factor above 1, unreadable, or with a negative P", () => {
    const errors = rowErrors("bus,name,P,pf\nb-town,A,1,1.2\nb-town,B,1,0.9 sideways\nb-town,C,-1,0.9");
    expect(errors.map((e) => [e.row, e.column])).toEqual([
      [2, "pf"],
      [3, "pf"],
      [4, "pf"],
    ]);
    expect(errors[0].message).toMatch(/at most 1/);
    expect(errors[2].message).toMatch(/positive P/);
  });

  it("an unknown load model", () => {
    expect(rowErrors("bus,name,P,Q,model\nb-town,A,1,0,flat")[0]).toMatchObject({ row: 2, column: "model", message: expect.stringMatching(/not a load model/) });
  });

  it("a new load without a name", () => {
    expect(rowErrors("bus,name,P,Q\nb-town,,1,0")[0]).toMatchObject({ row: 2, column: "name", message: "a new load needs a name" });
  });

  it("two rows for the same load, or two new loads of one name", () => {
    const errors = rowErrors("bus,name,P,Q\nb-town,Calder Flats town,1,0\nb-town,Calder Flats town,2,0\nb-town,New,1,0\nb-mine,new,1,0");
    expect(errors).toEqual([
      { row: 3, column: "name", message: 'row 2 already changes load "Calder Flats town" (ld-town)' },
      { row: 5, column: "name", message: 'row 4 already adds a load named "new"' },
    ]);
  });

  it("an id already used by another element", () => {
    expect(rowErrors("id,bus,name,P,Q\nb-town,b-town,A,1,0")[0]).toMatchObject({ row: 2, column: "id", message: expect.stringMatching(/already used/) });
  });

  it("a row with more cells than the header, and an unclosed quote", () => {
    const errors = rowErrors('bus,name,P,Q\nb-town,A,1,0,9\nb-town,"B,1,0');
    expect(errors.map((e) => e.row)).toEqual([2, 3]);
    expect(errors[0].message).toMatch(/5 cells but the header has 4/);
    expect(errors[1].message).toMatch(/never closed/);
  });

  it("nothing changes when any row is wrong: the preview offers no network", () => {
    const preview = previewLoadsCsv("bus,name,P,Q\nb-town,Good,1,0\nb-nowhere,Bad,1,0", tarnHead());
    expect(preview.ok).toBe(false);
    expect(preview.network).toBeUndefined();
    expect(preview.totalRowErrors).toBe(1);
  });
});

describe("loads CSV: files it refuses as a whole", () => {
  it("a header without bus or P", () => {
    expect(previewLoadsCsv("name,Q\nA,1", tarnHead()).fileError).toMatch(/no "bus", "P \(MW\)" columns/);
  });

  it("a header with neither Q nor a power factor", () => {
    expect(previewLoadsCsv("bus,name,P\nb-town,A,1", tarnHead()).fileError).toMatch(/"Q \(Mvar\)" column or a "power factor"/);
  });

  it("a header unit that is not a power", () => {
    expect(previewLoadsCsv("bus,name,P (kV),Q\nb-town,A,1,0", tarnHead()).fileError).toMatch(/unit "kV", which is not/);
  });

  it("two columns for one field", () => {
    expect(previewLoadsCsv("bus,name,P,P (kW),Q\nb-town,A,1,1,0", tarnHead()).fileError).toMatch(/both give P \(MW\)/);
  });

  it("an empty file, a header alone, and a file over 5 MB", () => {
    expect(previewLoadsCsv("", tarnHead()).fileError).toMatch(/empty/);
    expect(previewLoadsCsv("bus,name,P,Q\n", tarnHead()).fileError).toMatch(/no rows/);
    const big = "bus,name,P,Q\n" + "b-town,A,1,0\n".repeat(Math.ceil(UPLOAD_LIMIT_BYTES / 13) + 1);
    expect(previewLoadsCsv(big, tarnHead()).fileError).toMatch(/may be at most 5\.0 MB; this one is 5\.0 MB/);
  });
});

describe("readPowerFactor and reactivePowerMvar", () => {
  it("unity power factor gives no reactive power", () => {
    expect(reactivePowerMvar(5, 1, false)).toBe(0);
  });

  it("reads lagging when not said (common practice for loads) and the usual spellings", () => {
    expect(readPowerFactor("0.9", ",")).toEqual({ ok: true, value: 0.9, leading: false });
    expect(readPowerFactor("0,9 lead", ";")).toEqual({ ok: true, value: 0.9, leading: true });
    expect(readPowerFactor("0.95 Capacitive", ",")).toEqual({ ok: true, value: 0.95, leading: true });
    expect(readPowerFactor("0", ",").ok).toBe(false);
  });
});
