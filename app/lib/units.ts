// Reading quantities typed by a planner ("33 kV", "0.12 ohm/km", "25 MVA", "18 %") into the number
// a network field stores in its own unit. mathjs does the unit arithmetic; this module decides
// which units fit which field, because mathjs treats W, VA and var as one dimension.
import { create, createUnitDependencies, unitDependencies, type Unit } from "mathjs";
import { formatQuantity, quantityKinds, tidy, type QuantityKind } from "./unitFormat.ts";

const math = create({ unitDependencies, createUnitDependencies });
// Reactive power is dimensionally a power; a unit of its own lets "2 Mvar" read as such.
math.createUnit("var", { definition: "1 VA", prefixes: "short" });

export { formatQuantity, unitLabel, type QuantityKind } from "./unitFormat.ts";

export type ParsedQuantity =
  | { ok: true; value: number; /** What was understood, e.g. "= 0.5 kV". */ understood: string }
  | { ok: false; error: string };

const plainNumber = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/**
 * Spellings planners type that mathjs reads differently: "Ω" and "µ" are not in its alphabet,
 * and lower-case "mw" or "mva" would be milli-units, which no one means on a power network.
 */
function normalise(text: string): string {
  return text
    .replace(/(\d),(?=\d{3}(\D|$))/g, "$1")
    .replace(/[µμ]/g, "u")
    .replace(/Ω|ohms\b/gi, "ohm")
    .replace(/\bohm\b/gi, "ohm")
    .replace(/\b([kmg]?)(var|va|w)\b/gi, (_, prefix: string, unit: string) => {
      const p = prefix.toLowerCase() === "k" ? "k" : prefix ? prefix.toUpperCase() : "";
      const u = unit.toLowerCase() === "var" ? "var" : unit.toUpperCase();
      return p + u;
    })
    .replace(/\bkv\b/gi, "kV")
    .replace(/\bka\b/gi, "kA")
    .trim();
}

/** Read what a planner typed into a field of the given kind; bad input gives a sentence, never a throw. */
export function parseQuantity(input: string, kind: QuantityKind): ParsedQuantity {
  const spec = quantityKinds[kind];
  const text = normalise(input);
  if (!text) return { ok: false, error: "is required" };
  if (/\d,\d/.test(text)) return { ok: false, error: "use a point for decimals, e.g. 0.12" };

  const percent = /^(.*?)\s*%$/.exec(text);
  if (percent) {
    const number = percent[1].trim();
    if (!plainNumber.test(number)) return { ok: false, error: `cannot read "${input.trim()}" as a percentage` };
    if (kind === "pct") return understood(Number(number), kind);
    if (kind === "pu") return understood(Number(number) / 100, kind);
    return { ok: false, error: `a percentage does not fit here; expected ${spec.expects}` };
  }

  const perUnit = /^(.*?)\s*p\.?u\.?$/i.exec(text);
  if (perUnit) {
    const number = perUnit[1].trim();
    if (kind !== "pu") return { ok: false, error: `a per-unit value does not fit here; expected ${spec.expects}` };
    if (!plainNumber.test(number)) return { ok: false, error: `cannot read "${input.trim()}" as a number` };
    return understood(Number(number), kind);
  }

  if (plainNumber.test(text)) return understood(Number(text), kind);

  if (!spec.mathUnit) return { ok: false, error: `expected ${spec.expects}` };

  let unit: Unit;
  try {
    unit = math.unit(text);
  } catch {
    return { ok: false, error: `cannot read "${input.trim()}"; expected ${spec.expects}` };
  }
  const target = math.unit(spec.mathUnit);
  if (unit.value === null || !unit.equalBase(target)) {
    return { ok: false, error: `"${input.trim()}" is not ${spec.expects}` };
  }
  if (spec.accepts) {
    const names = unit.units.map((u) => u.unit.name);
    if (names.length !== 1 || !spec.accepts.includes(names[0])) {
      return { ok: false, error: `"${input.trim()}" is not ${spec.expects}` };
    }
  }
  return understood(unit.toNumber(spec.mathUnit), kind);
}

function understood(value: number, kind: QuantityKind): ParsedQuantity {
  if (!Number.isFinite(value)) return { ok: false, error: "must be a finite number" };
  const tidied = tidy(value);
  // Six significant digits are plenty to confirm what was read; the field keeps all twelve.
  return { ok: true, value: tidied, understood: `= ${formatQuantity(Number(tidied.toPrecision(6)), kind)}` };
}
