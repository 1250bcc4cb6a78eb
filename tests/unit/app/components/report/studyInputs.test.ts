// The report's inputs of each alternative: a conductor the ladder's sizing chose is named as such,
// not printed as "as drawn".
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import tarnHead from "../../../../fixtures/tarn-head-calder-flats.json";
import { StudyInputs } from "#app/components/report/StudyInputs.tsx";
import { builtInLadderConductors } from "#app/lib/conductorCandidates.ts";
import { runLadder } from "#solver/ladder.ts";

describe("the report's inputs of each alternative", () => {
  it("names the sized conductor and its clearing time, and says when none passed", () => {
    const outcome = runLadder(tarnHead, { sectionBus: "b-calder-66", voltagesKV: [33, 66], sizing: { clearingTimeS: 0.5 } }, undefined, builtInLadderConductors);
    if (!outcome.ok) throw new Error(JSON.stringify(outcome.issues));
    const html = renderToStaticMarkup(createElement(StudyInputs, { ladder: outcome.ladder, network: outcome.ladder.alternatives[1].network, overrides: undefined }));
    const text = html.replace(/<[^>]+>/g, " ").replace(/\s+/g, " ");
    expect(text).toContain("33 kV as drawn (no library type passes)");
    expect(text).toMatch(/66 kV ACSR [^,]+, sized from the library for a fault cleared in 0\.5 s/);
    expect(text).toContain("from unit costs, line by its sized conductor");
  });
});
