import Papa from "papaparse";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CSV_ROW_LIMIT, detectDelimiter, readCsvTable } from "#app/lib/imports/csvTable.ts";

describe("readCsvTable", () => {
  it("detects the separator from the header, ignoring separators inside quotes", () => {
    expect(detectDelimiter('"a,b";c;d\n1;2;3')).toBe(";");
    expect(detectDelimiter("a\tb\tc\n")).toBe("\t");
    expect(detectDelimiter("a|b\n")).toBe("|");
    expect(detectDelimiter("single\n1")).toBe(",");
  });

  it("numbers rows as a spreadsheet does, with leading blank lines before the header", () => {
    const reading = readCsvTable("\n\nbus,P\nb1,1\n\nb2,2\n", "A file");
    expect(reading.ok).toBe(true);
    if (reading.ok) {
      expect(reading.table.headers).toEqual(["bus", "P"]);
      expect(reading.table.rows.map((r) => r.row)).toEqual([4, 6]);
    }
  });

  it("refuses more rows than the limit with a sentence", () => {
    const reading = readCsvTable(`a\n${"1\n".repeat(CSV_ROW_LIMIT + 1)}`, "A file");
    expect(reading).toEqual({ ok: false, error: "The file has more than 20,000 rows; split it into smaller files." });
  });

  it("reads back what papaparse writes, for any cells (fast-check, 300 cases)", () => {
    const cell = fc.string({ maxLength: 12 }).filter((s) => s.trim() === s && s !== "");
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 6 }), (rows) => {
        const text = Papa.unparse([["a", "b", "c"], ...rows], { quotes: true });
        const reading = readCsvTable(text, "A file");
        expect(reading.ok).toBe(true);
        if (reading.ok) {
          expect(reading.rowErrors).toEqual([]);
          expect(reading.table.rows.map((r) => r.cells)).toEqual(rows);
        }
      }),
      { numRuns: 300 },
    );
  });
});
