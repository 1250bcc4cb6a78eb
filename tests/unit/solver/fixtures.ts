// The network files in tests/fixtures, read and validated once for the solver tests.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { validateNetwork, type Network } from "#solver/schema.ts";

export const FIXTURE_DIR = join(import.meta.dirname, "..", "..", "fixtures");

export interface Fixture {
  file: string;
  path: string;
  document: unknown;
  network: Network;
}

/** Every valid network file in tests/fixtures (files that are meant to be invalid are left out). */
export function validFixtures(): Fixture[] {
  return readdirSync(FIXTURE_DIR)
    .filter((f) => f.endsWith(".json"))
    .sort()
    .flatMap((file) => {
      const path = join(FIXTURE_DIR, file);
      const document: unknown = JSON.parse(readFileSync(path, "utf8"));
      const validated = validateNetwork(document);
      return validated.ok ? [{ file, path, document, network: validated.network }] : [];
    });
}

export function fixture(file: string): Fixture {
  const found = validFixtures().find((f) => f.file === file);
  if (!found) throw new Error(`fixture ${file} is missing or invalid`);
  return found;
}
