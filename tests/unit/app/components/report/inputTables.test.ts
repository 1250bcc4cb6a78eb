// The study report's input data: every element of the network file appears with its values and
// units, a kind the network lacks is named once in words, and each bus carries the voltage
// class the drawings use for it.
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import hollinMoor from "../../../../fixtures/hollin-moor-solar.json";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { InputTables } from "#app/components/report/InputTables.tsx";
import { validateNetwork, type Network } from "#solver/schema.ts";

function network(document: unknown): Network {
  const checked = validateNetwork(document);
  if (!checked.ok) throw new Error(checked.issues.map((i) => i.message).join("; "));
  return checked.network;
}

const render = (doc: Network) => renderToStaticMarkup(createElement(InputTables, { network: doc }));

/** The text of the table row whose header starts with `name`. */
function rowText(html: string, name: string): string {
  const row = [...html.matchAll(/<tr>(.*?)<\/tr>/g)].map((m) => m[1]).find((r) => r.startsWith(`<th scope="row">${name}<span`));
  if (!row) throw new Error(`no row for ${name}`);
  return row.replace(/<[^>]+>/g, " ").replace(/\s+/g, " ").trim();
}

describe("the report's input tables", () => {
  const tarn = network(tarnHead);
  const html = render(tarn);

  it("list every element of every kind by name", () => {
    const names = [...tarn.buses, ...tarn.sources, ...tarn.transformers, ...tarn.lines, ...tarn.loads, ...tarn.shunts].map((e) => e.name);
    for (const name of names) expect(html).toContain(`<th scope="row">${name}`);
    expect(html).not.toContain("This network has no");
  });

  it("give each quantity its unit in the column header", () => {
    for (const unit of ["kV", "pu", "kA", "MW", "Mvar", "MVA", "%", "kW", "km", "Ω/km", "µS/km", "A"]) expect(html).toContain(`<span class="unit">${unit}</span>`);
  });

  it("write the values as the file gives them", () => {
    const fell = tarn.lines.find((l) => l.name === "Fell crossing 66 kV")!;
    const row = rowText(html, "Fell crossing 66 kV");
    expect(row).toContain(`${fell.lengthKm}`);
    expect(row).toContain(`${fell.rOhmPerKm}`);
    const mine = tarn.loads.find((l) => l.name === "Sallow Rigg mine")!;
    // The demo's mine is 9 MW at power factor 0.85 lagging; the table works the factor out from P and Q.
    expect(mine.pMW).toBe(9);
    expect(rowText(html, "Sallow Rigg mine")).toMatch(/ 9 5\.57\d 0\.85 lagging /);
  });

  it("tag each bus with the sheet's voltage class: 11 kV in 1 to 35 kV, 66 kV in 35 to 150 kV, 132 kV too", () => {
    expect(rowText(html, "Tarn Head 11 kV")).toContain("1 to 35 kV");
    expect(rowText(html, "Tarn Head 66 kV")).toContain("35 to 150 kV");
    expect(rowText(render(network(hollinMoor)), "Greyscar 132 kV grid")).toContain("35 to 150 kV");
  });

  it("say in words which kinds a network has none of, instead of an empty table", () => {
    const hollin = render(network(hollinMoor));
    expect(hollin).toContain("This network has no shunts.");
    expect(hollin).not.toContain("<caption>Shunts</caption>");
  });
});
