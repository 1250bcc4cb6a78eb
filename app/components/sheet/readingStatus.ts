// Status of a reading against its limit: within, near (within 2 % of the limit) or beyond.
// Status is always shown with an icon and words as well as colour.

export type LimitStatus = "within" | "near" | "beyond";

/** "Near a limit" means within this fraction of the limit's own value. */
export const NEAR_LIMIT_FRACTION = 0.02;

export const statusCue: Record<LimitStatus, { icon: string; words: string; className: string }> = {
  within: { icon: "✓", words: "within limits", className: "ks-status-within" },
  near: { icon: "▲", words: "near a limit", className: "ks-status-near" },
  beyond: { icon: "✕", words: "beyond a limit", className: "ks-status-beyond" },
};

export function voltageStatus(vPu: number, vMinPu: number, vMaxPu: number): LimitStatus {
  if (vPu < vMinPu || vPu > vMaxPu) return "beyond";
  if (vPu < vMinPu * (1 + NEAR_LIMIT_FRACTION) || vPu > vMaxPu * (1 - NEAR_LIMIT_FRACTION)) return "near";
  return "within";
}

/** A value with an upper limit only: loading against 100 %, fault current against breaking current. */
export function upperLimitStatus(value: number | null | undefined, limit: number | undefined): LimitStatus | undefined {
  if (value === null || value === undefined || limit === undefined) return undefined;
  if (value > limit) return "beyond";
  if (value >= limit * (1 - NEAR_LIMIT_FRACTION)) return "near";
  return "within";
}

export function worstStatus(statuses: (LimitStatus | undefined)[]): LimitStatus | undefined {
  if (statuses.includes("beyond")) return "beyond";
  if (statuses.includes("near")) return "near";
  return statuses.includes("within") ? "within" : undefined;
}
