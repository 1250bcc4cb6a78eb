// The demo networks, validated, for the ladder tests.
import { readFileSync } from "node:fs";
import { validateNetwork, type Network } from "#solver/schema.ts";

export function loadFixture(file: "tarn-head-calder-flats.json" | "hollin-moor-solar.json"): Network {
  const validated = validateNetwork(JSON.parse(readFileSync(new URL(`../../fixtures/${file}`, import.meta.url), "utf8")));
  if (!validated.ok) throw new Error(`fixture ${file} is invalid: ${JSON.stringify(validated.issues)}`);
  return validated.network;
}
