// How the ladder's numbers and verdicts are written, shared by the ladder page and the report:
// fixed decimals so columns line up, and every status with an icon and words besides its colour.
import type { Check, CheckKind } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import type { LadderAlternative } from "#solver/ladder.ts";

export function fixed(value: number | null | undefined, digits: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  const text = value.toFixed(digits);
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text.replace("-", "−");
}

export const kvText = (voltageKV: number) => `${Number(voltageKV.toPrecision(6))} kV`;

/** Whole currency units with thousands separators, the currency after: "11,504,414 EUR". */
export function moneyText(value: number | null | undefined, currency: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return `${Math.round(value).toLocaleString("en-GB")} ${currency}`;
}

/** Millions with one decimal for chart axes: "11.5 M". */
export function millionsText(value: number): string {
  return `${(value / 1e6).toLocaleString("en-GB", { maximumFractionDigits: 1 })} M`;
}

export type AlternativeVerdict = "cannot-carry" | "limits-broken" | "within-limits";

export const verdictCue: Record<AlternativeVerdict, { icon: string; className: string }> = {
  "within-limits": { icon: "✓", className: "ks-verdict-within" },
  "limits-broken": { icon: "▲", className: "ks-verdict-broken" },
  "cannot-carry": { icon: "✕", className: "ks-verdict-cannot" },
};

const LIMIT_KINDS: readonly CheckKind[] = ["undervoltage", "overvoltage", "line-overload", "transformer-overload"];

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

const CHECK_WORDS: Record<CheckKind, string> = {
  undervoltage: "below its band",
  overvoltage: "above its band",
  "line-overload": "over its ampacity",
  "transformer-overload": "over its rating",
  "breaking-current": "fault current above breaking current",
  "not-converged": "load flow does not converge",
  "minimum-fault-level": "minimum fault level below what is asked",
  "weak-grid": "short-circuit ratio low for a converter plant",
};

function valueText(check: Check): string {
  switch (check.kind) {
    case "undervoltage":
    case "overvoltage":
      return `${fixed(check.value, 3)} pu (limit ${fixed(check.limit, 2)})`;
    case "line-overload":
      return `${fixed(check.value, 0)} A > ${fixed(check.limit, 0)} A`;
    case "transformer-overload":
      return `${fixed(check.value, 1)} MVA > ${fixed(check.limit, 1)} MVA`;
    case "breaking-current":
      return `${fixed(check.value, 2)} kA > ${fixed(check.limit, 1)} kA`;
    case "not-converged":
      return `${fixed(check.value, 0)} % of the load solves`;
    case "minimum-fault-level":
      return `${fixed(check.value, 0)} MVA < ${fixed(check.limit, 0)} MVA`;
    case "weak-grid":
      return `SCR ${fixed(check.value, 2)} < ${fixed(check.limit, 1)}`;
  }
}

/** One line per check: the element by name, what is wrong, and the value against its limit. */
export function checkLine(check: Check, network: Network): string {
  const name =
    [...network.buses, ...network.lines, ...network.transformers, ...network.sources].find((e) => e.id === check.element)?.name ?? check.element;
  return check.kind === "not-converged" ? `${CHECK_WORDS[check.kind]} (${valueText(check)})` : `${name}: ${CHECK_WORDS[check.kind]}, ${valueText(check)}`;
}
