// How the ladder's verdicts are written, shared by the ladder page and the report: every verdict
// with an icon and words besides its colour.
import type { CheckKind } from "#solver/results.ts";
import type { LadderAlternative } from "#solver/ladder.ts";

export type AlternativeVerdict = "cannot-carry" | "limits-broken" | "within-limits";

export const verdictCue: Record<AlternativeVerdict, { icon: string; className: string }> = {
  "within-limits": { icon: "✓", className: "ks-verdict-within" },
  "limits-broken": { icon: "▲", className: "ks-verdict-broken" },
  "cannot-carry": { icon: "✕", className: "ks-verdict-cannot" },
};

export const LIMIT_KINDS: readonly CheckKind[] = ["undervoltage", "overvoltage", "line-overload", "transformer-overload"];

export function verdictOf(a: Pick<LadderAlternative, "converged" | "withinLimits">): AlternativeVerdict {
  if (!a.converged) return "cannot-carry";
  return a.withinLimits ? "within-limits" : "limits-broken";
}

export function verdictWords(a: Pick<LadderAlternative, "converged" | "withinLimits" | "checks">): string {
  const verdict = verdictOf(a);
  if (verdict === "cannot-carry") return "Cannot carry the load";
  if (verdict === "within-limits") return "Within limits";
  const broken = a.checks.filter((c) => LIMIT_KINDS.includes(c.kind)).length;
  return `${broken} limit${broken === 1 ? "" : "s"} broken`;
}

