// Status of a reading against its limit: within, near (within 2 % of the limit) or beyond, judged
// on the value as shown (see readingAgainstLimit), so a flag never contradicts the number beside it.
// Status is always shown with an icon and words as well as colour.
import { decimalsAgainstLimits, roundTo, type Quantity } from "#solver/quantities.ts";

export type LimitStatus = "within" | "near" | "beyond";

/** "Near a limit" means within this fraction of the limit's own value. */
export const NEAR_LIMIT_FRACTION = 0.02;

export const statusCue: Record<LimitStatus, { icon: string; words: string; className: string }> = {
  within: { icon: "✓", words: "within limits", className: "ks-status-within" },
  near: { icon: "▲", words: "near a limit", className: "ks-status-near" },
  beyond: { icon: "✕", words: "beyond a limit", className: "ks-status-beyond" },
};

/** Ranks for sorting a table by status: worst last. */
export const statusSeverity: Record<LimitStatus, number> = { within: 0, near: 1, beyond: 2 };

/** A bus voltage against its band, judged on the per-unit value as shown. */
export function voltageStatus(vPu: number, vMinPu: number, vMaxPu: number): LimitStatus {
  const shown = roundShownAgainst(vPu, [vMinPu, vMaxPu], "pu");
  if (shown < vMinPu || shown > vMaxPu) return "beyond";
  if (shown < vMinPu * (1 + NEAR_LIMIT_FRACTION) || shown > vMaxPu * (1 - NEAR_LIMIT_FRACTION)) return "near";
  return "within";
}

/** A value with an upper limit only: loading against 100 %, fault current against breaking current. */
export function upperLimitStatus(value: number | null | undefined, limit: number | undefined, quantity: Quantity): LimitStatus | undefined {
  if (value === null || value === undefined || limit === undefined) return undefined;
  const shown = roundShownAgainst(value, [limit], quantity);
  if (shown > limit) return "beyond";
  if (shown >= limit * (1 - NEAR_LIMIT_FRACTION)) return "near";
  return "within";
}

/** A value with a lower limit only: the minimum fault level against what the planner asks of a bus. */
export function lowerLimitStatus(value: number | null | undefined, limit: number | undefined, quantity: Quantity): LimitStatus | undefined {
  if (value === null || value === undefined || limit === undefined) return undefined;
  const shown = roundShownAgainst(value, [limit], quantity);
  if (shown < limit) return "beyond";
  if (shown <= limit * (1 + NEAR_LIMIT_FRACTION)) return "near";
  return "within";
}

/**
 * The value as readingAgainstLimit shows it: at the quantity's precision, or finer where that
 * precision would make it equal to a limit it is not equal to.
 */
function roundShownAgainst(value: number, limits: number[], quantity: Quantity): number {
  return roundTo(value, decimalsAgainstLimits(value, limits, quantity));
}

export function worstStatus(statuses: (LimitStatus | undefined)[]): LimitStatus | undefined {
  if (statuses.includes("beyond")) return "beyond";
  if (statuses.includes("near")) return "near";
  return statuses.includes("within") ? "within" : undefined;
}
