// Operating cases name loads, sources and elements by id; when the planner removes an element,
// its mentions in the cases go with it, so a deletion never leaves a case pointing at nothing.
import type { Network } from "#solver/schema.ts";

export function withoutCaseReferences<T extends Pick<Network, "cases">>(document: T, removedIds: ReadonlySet<string>): T {
  if (!document.cases || removedIds.size === 0) return document;
  const mentions = (c: NonNullable<Network["cases"]>[number]) =>
    Object.keys(c.loads ?? {}).some((id) => removedIds.has(id)) ||
    Object.keys(c.sources ?? {}).some((id) => removedIds.has(id)) ||
    (c.outOfService ?? []).some((id) => removedIds.has(id));
  if (!document.cases.some(mentions)) return document;
  const keep = <V,>(record: Record<string, V> | undefined) =>
    record && Object.fromEntries(Object.entries(record).filter(([id]) => !removedIds.has(id)));
  return {
    ...document,
    cases: document.cases.map((c) =>
      mentions(c)
        ? { ...c, loads: keep(c.loads), sources: keep(c.sources), outOfService: c.outOfService?.filter((id) => !removedIds.has(id)) }
        : c,
    ),
  };
}
