import { readFileSync } from "node:fs";
import { join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { findJsonSyntaxError } from "#app/lib/imports/jsonSyntax.ts";
import { readNetworkFile, LISTED_ISSUES_MAX } from "#app/lib/imports/networkFile.ts";
import { UPLOAD_LIMIT_BYTES, utf8ByteLength } from "#app/lib/imports/uploadLimits.ts";

const fixtureText = (file: string) => readFileSync(join(import.meta.dirname, "..", "..", "..", "..", "fixtures", file), "utf8");
const tarnHead = fixtureText("tarn-head-calder-flats.json");

function refused(text: string, byteLength?: number) {
  const reading = readNetworkFile(text, byteLength);
  if (reading.ok) throw new Error("the file was accepted");
  return reading;
}

describe("readNetworkFile: a good file", () => {
  it("previews the Tarn Head demo: elements by kind and its two voltage levels", () => {
    const reading = readNetworkFile(tarnHead);
    expect(reading.ok).toBe(true);
    if (!reading.ok) return;
    expect(reading.preview.name).toBe("Tarn Head to Calder Flats (fictional)");
    expect(reading.preview.frequencyHz).toBe(50);
    // Counted by hand from the fixture: 6 buses, 1 hydro generator, 2 transformers, the 66 kV
    // overhead line and town feeder, the mine cable, 2 loads and the capacitor bank.
    expect(reading.preview.counts).toEqual({
      buses: 6,
      gridInfeeds: 0,
      generators: 1,
      transformers: 2,
      overheadLines: 2,
      cables: 1,
      loads: 2,
      shunts: 1,
    });
    expect(reading.preview.voltageLevelsKV).toEqual([66, 11]);
    expect(reading.network.buses).toHaveLength(6);
  });

  it("reads a file saved with a byte order mark", () => {
    expect(readNetworkFile(`\ufeff${tarnHead}`).ok).toBe(true);
  });

  it("previews the solar example's grid infeed and 132/33 kV levels", () => {
    const reading = readNetworkFile(fixtureText("hollin-moor-solar.json"));
    expect(reading.ok).toBe(true);
    if (reading.ok) {
      expect(reading.preview.counts.gridInfeeds).toBe(1);
      expect(reading.preview.voltageLevelsKV).toEqual([132, 33]);
    }
  });
});

describe("readNetworkFile: files it refuses, each with a clear reason", () => {
  it("refuses a file over 5 MB by its size, before reading it", () => {
    const reading = refused("{}", 7.3 * 1024 * 1024);
    expect(reading.error).toBe("A network file may be at most 5.0 MB; this one is 7.3 MB.");
    expect(reading.preview).toBeNull();
  });

  it("counts the size of a real 5 MB+ text itself when no size is given", () => {
    const doc = JSON.parse(tarnHead);
    doc.name = "x".repeat(UPLOAD_LIMIT_BYTES);
    const text = JSON.stringify(doc);
    expect(utf8ByteLength(text)).toBeGreaterThan(UPLOAD_LIMIT_BYTES);
    expect(refused(text).error).toMatch(/^A network file may be at most 5\.0 MB; this one is 5\.0 MB\.$/);
  });

  it("refuses an empty file", () => {
    expect(refused("  \n").error).toMatch(/empty/);
  });

  it("gives the line and column of a JSON syntax error", () => {
    const broken = tarnHead.replace('"version": 2,', '"version": 2');
    const reading = refused(broken);
    // The missing comma is noticed where the next field name starts: line 4, column 3.
    expect(reading.error).toContain("line 4, column 3");
    expect(reading.issues[0].path).toBe("line 4, column 3");
    expect(reading.issues[0].message).toMatch(/comma missing/);
  });

  it("lists every schema problem with its path, and still counts what the file holds", () => {
    const doc = JSON.parse(tarnHead);
    doc.buses[1].nominalKV = -66;
    doc.loads[0].bus = "b-nowhere";
    doc.lines[0].colour = "red";
    const reading = refused(JSON.stringify(doc));
    const paths = reading.issues.map((i) => i.path);
    expect(paths).toContain("buses[1].nominalKV");
    expect(paths).toContain("lines[0]");
    expect(reading.issues.find((i) => i.path === "lines[0]")?.message).toMatch(/unknown field "colour"/);
    expect(reading.error).toMatch(/problems? found/);
    expect(reading.preview?.counts.buses).toBe(6);
    expect(reading.preview?.voltageLevelsKV).toEqual([66, 11]);
  });

  it("names the cross-element problem of a missing bus with its path", () => {
    const doc = JSON.parse(tarnHead);
    doc.loads[0].bus = "b-nowhere";
    const reading = refused(JSON.stringify(doc));
    expect(reading.issues).toEqual([
      { path: "loads[0].bus", message: 'Load "Sallow Rigg mine" (ld-mine) refers to bus "b-nowhere", which does not exist' },
    ]);
  });

  it("refuses JSON that is not an object, with no preview", () => {
    for (const text of ["42", "[]", "null", '"network"']) {
      const reading = refused(text);
      expect(reading.preview).toBeNull();
      expect(reading.issues.length).toBeGreaterThan(0);
    }
  });

  it("lists at most 200 problems but reports the total", () => {
    const doc = JSON.parse(tarnHead);
    doc.loads = Array.from({ length: 500 }, (_, i) => ({ id: `x${i}`, name: "L", bus: "missing", pMW: 1 }));
    const reading = refused(JSON.stringify(doc));
    expect(reading.totalIssues).toBe(500);
    expect(reading.issues).toHaveLength(LISTED_ISSUES_MAX);
  });

  it("survives nesting a hundred thousand deep without overflowing", () => {
    const deep = `{"buses": ${"[".repeat(100_000)}${"]".repeat(100_000)}}`;
    expect(refused(deep).ok).toBe(false);
    const unclosed = "[".repeat(100_000);
    expect(refused(unclosed).error).toMatch(/ends inside a list/);
  });
});

describe("findJsonSyntaxError", () => {
  const at = (text: string) => {
    const found = findJsonSyntaxError(text);
    if (!found) throw new Error(`${JSON.stringify(text)} was read as JSON`);
    return found;
  };

  it("names the common slips of a hand-edited file", () => {
    expect(at('{"a": 1,}')).toMatchObject({ line: 1, column: 9, message: expect.stringMatching(/no comma before a closing/) });
    expect(at("[1, 2,]")).toMatchObject({ column: 7, message: expect.stringMatching(/no comma before a closing/) });
    expect(at("{'a': 1}")).toMatchObject({ column: 2, message: expect.stringMatching(/single quote/) });
    expect(at('{"a": 1}\n{"b": 2}')).toMatchObject({ line: 2, column: 1, message: expect.stringMatching(/after the end/) });
    expect(at('{"a": "open\n"}')).toMatchObject({ line: 1, column: 12 });
    expect(at('{"a" 1}').message).toMatch(/":" was expected/);
    expect(at('{"a": tru}').message).toMatch(/where a value was expected/);
    expect(at('{"a": "\\x"}').message).toMatch(/not a JSON escape/);
    expect(at('{"a": 01}').message).toMatch(/"," or "}" was expected/);
    expect(at('{"a": 1').message).toMatch(/ends inside an object/);
  });

  it("agrees with JSON.parse on every valid document (fast-check, 500 cases)", () => {
    fc.assert(
      fc.property(fc.json(), (text) => {
        expect(findJsonSyntaxError(text)).toBeNull();
      }),
      { numRuns: 500 },
    );
  });

  it("agrees with JSON.parse on whether a mutated document is JSON (fast-check, 2,000 cases)", () => {
    const mutated = fc
      .tuple(fc.json(), fc.nat(), fc.constantFrom("", ",", "}", "]", '"', ":", "\\", "'", " ", "\n", "0", "-", "e", "\u0001"), fc.nat(3))
      .map(([text, at, insert, remove]) => {
        const i = at % (text.length + 1);
        return text.slice(0, i) + insert + text.slice(i + remove);
      });
    fc.assert(
      fc.property(mutated, (text) => {
        let parses = true;
        try {
          JSON.parse(text);
        } catch {
          parses = false;
        }
        expect(findJsonSyntaxError(text) === null).toBe(parses);
      }),
      { numRuns: 2000 },
    );
  });
});

describe("utf8ByteLength matches Node's Buffer.byteLength (an independent count)", () => {
  it("on ASCII, accents, symbols and astral characters", () => {
    for (const text of ["bus", "Calder Flats 11 kV", "Ω/km µS", "€ 20 000", "𝑋 ⚡ 😀", "\ud800 lone"])
      expect(utf8ByteLength(text)).toBe(Buffer.byteLength(text, "utf8"));
  });
});
