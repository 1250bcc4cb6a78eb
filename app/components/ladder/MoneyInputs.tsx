// The money inputs with the defaults a planner recognises, and what they come to (loss load
// factor, present-worth factor) worked out as they are typed. Also the read-only summary of the
// same inputs that the study report prints.
import type { ReactNode } from "react";
import { FormField } from "#app/components/FormField.tsx";
import { lossLoadFactor, presentWorthFactor, type CostPoint, type MoneyInput } from "#solver/economics.ts";
import { fixed, kvText } from "#app/lib/format.ts";
import type { FieldErrors, MoneyDraft, MoneyField } from "./studyDraft.ts";

const FIELDS: { field: MoneyField; label: (currency: string) => string; hint: string }[] = [
  { field: "loadFactor", label: () => "Load factor", hint: "Average load over peak load, 0 to 1." },
  { field: "lossLoadFactorK", label: () => "k of the loss load factor", hint: "0.15 to 0.3 in practice; 0.3 by default." },
  { field: "energyPricePerMWh", label: (c) => `Energy price, ${c}/MWh`, hint: "What a lost MWh costs." },
  { field: "discountRatePct", label: () => "Discount rate, % a year", hint: "For the present value of losses." },
  { field: "studyYears", label: () => "Study period, years", hint: "Years of losses counted." },
  { field: "loadGrowthPct", label: () => "Load growth, % a year", hint: "Losses grow with its square." },
];

export function MoneyInputs({
  draft,
  parsed,
  errors,
  onChange,
}: {
  draft: MoneyDraft;
  /** The inputs as they read now, or undefined while one is wrong. */
  parsed: MoneyInput | undefined;
  errors: FieldErrors;
  onChange: (patch: Partial<MoneyDraft>) => void;
}) {
  return (
    <div>
      <div className="ks-money-grid">
        {FIELDS.map(({ field, label, hint }) => (
          <FormField
            key={field}
            label={label(draft.currency)}
            name={field}
            inputMode="decimal"
            hint={hint}
            value={draft.text[field]}
            error={errors[`money.${field}`]}
            onChange={(event) => onChange({ text: { ...draft.text, [field]: event.target.value } })}
          />
        ))}
        <FormField
          label="Currency"
          name="currency"
          hint="Any code or name, e.g. EUR."
          value={draft.currency}
          error={errors["money.currency"]}
          onChange={(event) => onChange({ currency: event.target.value })}
        />
      </div>
      {parsed ? (
        <p className="ks-derived" aria-live="polite">
          Loss load factor {fixed(lossLoadFactor(parsed.loadFactor, parsed.lossLoadFactorK), 4)} (k·LF + (1 − k)·LF²); present-worth factor{" "}
          {fixed(presentWorthFactor(parsed.discountRatePct / 100, parsed.studyYears), 4)} for {parsed.studyYears} years at {parsed.discountRatePct} %.
        </p>
      ) : null}
    </div>
  );
}

export function UnitCostNote({ money }: { money: MoneyInput }) {
  return (
    <p className="field-hint ks-unit-costs">
      Unit costs used where no capital cost is entered, <strong>illustrative placeholders only</strong>: lines per km{" "}
      {costList(money.lineCostPerKmByKV, money.currency)}; transformers per MVA by HV winding {costList(money.transformerCostPerMVAByKV, money.currency)};
      cables {money.cableCostFactor} × the overhead cost. Enter your own capital cost for each alternative.
    </p>
  );
}

const costList = (table: readonly CostPoint[], currency: string) =>
  `${table.map((p) => `${kvText(p.voltageKV)} ${Math.round(p.cost).toLocaleString("en-GB")}`).join(", ")} ${currency}`;

/** A quantity's name with its unit, as the summary's row headings write it. */
const withUnit = (name: string, unit: string) => (
  <>
    {name} <span className="unit">{unit}</span>
  </>
);

/** The money inputs as the report prints them, with what they come to. */
export function MoneySummary({ money }: { money: MoneyInput }) {
  const llf = lossLoadFactor(money.loadFactor, money.lossLoadFactorK);
  const rows: [heading: ReactNode, value: ReactNode][] = [
    ["Load factor", fixed(money.loadFactor, 3)],
    ["k of the loss load factor", fixed(money.lossLoadFactorK, 3)],
    ["Loss load factor, k·LF + (1 − k)·LF²", fixed(llf, 4)],
    [withUnit("Energy price", `${money.currency}/MWh`), fixed(money.energyPricePerMWh, 2)],
    [withUnit("Discount rate", "% a year"), fixed(money.discountRatePct, 2)],
    [withUnit("Study period", "years"), money.studyYears],
    ["Present-worth factor, (1 − (1 + i)^−n) / i", fixed(presentWorthFactor(money.discountRatePct / 100, money.studyYears), 4)],
    [withUnit("Load growth", "% a year"), fixed(money.loadGrowthPct, 2)],
  ];
  return (
    <div className="ks-table-scroll" tabIndex={0} role="region" aria-label="Money inputs">
      <table className="data-table ks-money-summary">
        <tbody>
          {rows.map(([heading, value], i) => (
            <tr key={i}>
              <th scope="row">{heading}</th>
              <td className="num">{value}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
