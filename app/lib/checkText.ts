// One line per broken limit, for the ladder, the report and the sheet's checks: the element by name,
// what is wrong, and the value against its limit at the precision the tables use.
import type { Check, CheckKind } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";
import { indexElements } from "#solver/elements.ts";
import type { Quantity } from "#solver/quantities.ts";
import { readingAgainstLimit, readingNumber } from "./format.ts";

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
  const against = (quantity: Quantity) => readingAgainstLimit(check.value, [check.limit], quantity);
  switch (check.kind) {
    case "undervoltage":
    case "overvoltage":
      return `${against("pu")} pu (limit ${readingNumber(check.limit, "pu")})`;
    case "line-overload":
      return `${against("A")} A > ${readingNumber(check.limit, "A")} A`;
    case "transformer-overload":
      return `${against("MVA")} MVA > ${readingNumber(check.limit, "MVA")} MVA`;
    case "breaking-current":
      return `${against("kA")} kA > ${readingNumber(check.limit, "kA")} kA`;
    case "not-converged":
      return `${readingNumber(check.value, "pct")} % of the load solves`;
    case "minimum-fault-level":
      return `${readingNumber(check.value, "MVA")} MVA < ${readingNumber(check.limit, "MVA")} MVA`;
    case "weak-grid":
      return `SCR ${readingNumber(check.value, "ratio")} < ${readingNumber(check.limit, "ratio")}`;
  }
}

/** The element index of a network, built once however many checks are written about it. */
const indexes = new WeakMap<Network, ReturnType<typeof indexElements>>();
function elementsOf(network: Network): ReturnType<typeof indexElements> {
  let index = indexes.get(network);
  if (!index) indexes.set(network, (index = indexElements(network)));
  return index;
}

/** One line per check: the element by name, what is wrong, and the value against its limit. */
export function checkLine(check: Check, network: Network): string {
  const name = elementsOf(network).get(check.element)?.element.name ?? "an element";
  return check.kind === "not-converged" ? `${CHECK_WORDS[check.kind]} (${valueText(check)})` : `${name}: ${CHECK_WORDS[check.kind]}, ${valueText(check)}`;
}
