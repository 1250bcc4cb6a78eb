// Stored revisions this process has seen pass the network file's checks with the validator it
// runs: when they were saved here (every save validates first), or on their first solve after a
// restart. An editing session's autosaves fold into its revision, so a revision is known by its
// number and the time of its last save; once per such version is enough: the compute pool then
// solves it without validating again (solveValidated), which is most of a solve's overhead. A
// revision saved by an older release is validated on its first use, so a rule tightened since
// still speaks.
const trusted = new Set<string>();
const MAX_TRUSTED = 20_000;

const key = (networkId: number, revision: number, savedAt: string) => `${networkId}:${revision}:${savedAt}`;

export function trustRevision(networkId: number, revision: number, savedAt: string): void {
  const k = key(networkId, revision, savedAt);
  trusted.delete(k);
  trusted.add(k);
  if (trusted.size > MAX_TRUSTED) trusted.delete(trusted.values().next().value!);
}

export function isTrustedRevision(networkId: number, revision: number, savedAt: string): boolean {
  return trusted.has(key(networkId, revision, savedAt));
}
