// The demo networks, validated, for the ladder tests: as drawn (the cases they ship with left
// out, so a test speaks of one snapshot), or with their operating cases.
import { readFileSync } from "node:fs";
import { validateNetwork, type Network } from "#solver/schema.ts";

export function loadFixture(file: "tarn-head-calder-flats.json" | "hollin-moor-solar.json", options: { withCases?: boolean } = {}): Network {
  const document = JSON.parse(readFileSync(new URL(`../../fixtures/${file}`, import.meta.url), "utf8"));
  if (!options.withCases) {
    delete document.cases;
    delete document.growth;
  }
  const validated = validateNetwork(document);
  if (!validated.ok) throw new Error(`fixture ${file} is invalid: ${JSON.stringify(validated.issues)}`);
  return validated.network;
}
