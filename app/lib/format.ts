// Number and date formatting fixed to one locale and UTC, so the server's render and the
// browser's hydration print the same text. Readings take their precision from their quantity
// (#solver/quantities.ts), so the sheet, the ladder and the report print a value alike.
import { decimalsAgainstLimits, decimalsFor, QUANTITY_UNIT, SHOWN_PRECISION, type Quantity } from "#solver/quantities.ts";
const dateTime = new Intl.DateTimeFormat("en-GB", {
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  timeZone: "UTC",
});

const date = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

export function formatDateTime(iso: string): string {
  return `${dateTime.format(new Date(iso))} UTC`;
}

export function formatDate(iso: string): string {
  return date.format(new Date(iso));
}

/** A quantity with up to `digits` decimals and thousands separators; "–" when absent. */
export function formatNumber(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return value.toLocaleString("en-GB", { maximumFractionDigits: digits });
}

/** A value with fixed decimals and a true minus sign; a value that rounds to zero is "0", never "−0.00"; "–" when absent. */
export function fixed(value: number | null | undefined, digits: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  const text = value.toFixed(digits);
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text.replace("-", "−");
}

/** A reading at its quantity's shown precision, without its unit: "11.44", "451", "–". */
export function readingNumber(value: number | null | undefined, quantity: Quantity): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return fixed(value, decimalsFor(value, SHOWN_PRECISION[quantity]));
}

/** A reading with its unit: "11.44 kV", "−5.23°", "1.032 pu". */
export function readingText(value: number | null | undefined, quantity: Quantity): string {
  const number = readingNumber(value, quantity);
  const unit = QUANTITY_UNIT[quantity];
  if (number === "–" || !unit) return number;
  return quantity === "deg" ? `${number}°` : `${number} ${unit}`;
}

/**
 * A reading shown beside a limit it is judged against: with as many more decimals as it takes
 * for the number to differ from the limit when the value does (451 A over 450 A reads 100.2 %,
 * not 100 %), so the number shown always agrees with the flag beside it.
 */
export function readingAgainstLimit(value: number | null | undefined, limits: readonly (number | undefined)[], quantity: Quantity): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return fixed(value, decimalsAgainstLimits(value, limits, quantity));
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
