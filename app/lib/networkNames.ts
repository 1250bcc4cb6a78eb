// Names of networks within a team, as a planner tells them apart: case and spacing do not make a
// different network. Shared by the upload page (which warns at once) and its action (which decides).

/** The form a name is compared in. */
export function nameKey(name: string): string {
  return name.trim().replace(/\s+/g, " ").toLowerCase();
}

/** The first of `name`, "name (2)", "name (3)"… that no network in `taken` has; linear in `taken`. */
export function nextFreeName(name: string, taken: readonly string[]): string {
  const keys = new Set(taken.map(nameKey));
  if (!keys.has(nameKey(name))) return name;
  for (let n = 2; ; n++) {
    const candidate = `${name} (${n})`;
    if (!keys.has(nameKey(candidate))) return candidate;
  }
}
