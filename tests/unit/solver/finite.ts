// Walks a result object and lists every number that is NaN or infinite, with its path.
export function nonFiniteNumbers(value: unknown, path = ""): string[] {
  if (typeof value === "number") return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFiniteNumbers(v, `${path}[${i}]`));
  if (value && typeof value === "object")
    return Object.entries(value).flatMap(([k, v]) => nonFiniteNumbers(v, path ? `${path}.${k}` : k));
  return [];
}
