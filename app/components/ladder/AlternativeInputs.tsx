// What may differ per alternative beyond its voltage: the section's conductor, the taps of the
// transformers facing it, and its capital cost. An empty field keeps the drawn value or the
// estimate from unit costs, which is shown in the field as a placeholder.
import { useId, type ReactNode } from "react";
import { FieldError } from "#app/components/FormField.tsx";
import { capitalCost, costAtVoltage, moneyInputSchema, type MoneyInput } from "#solver/economics.ts";
import type { Section } from "#solver/ladder.ts";
import type { Network } from "#solver/schema.ts";
import { fixed, kvText } from "#app/lib/format.ts";
import { conductorOptions, emptyAlternative, SAVED_CONDUCTOR, voltageKey, type AlternativeDraft, type FieldErrors, type StudyDraft } from "./studyDraft.ts";

const signedPct = (value: number) => (value > 0 ? `+${value}` : value < 0 ? `−${-value}` : "0");

export function AlternativeInputs({
  network,
  section,
  draft,
  money,
  errors,
  onChange,
}: {
  network: Network;
  section: Section;
  draft: StudyDraft;
  /** The money inputs as they read now, for the estimates shown as placeholders. */
  money: MoneyInput | undefined;
  errors: FieldErrors;
  onChange: (voltageKV: number, patch: Partial<AlternativeDraft>) => void;
}) {
  const options = conductorOptions(network.frequencyHz);
  const sectionLines = network.lines.filter((l) => section.lineIds.includes(l.id));
  const facing = [...new Set(section.facingWindings.map((w) => w.transformerId))].map((id) => network.transformers.find((t) => t.id === id)!);
  const estimateMoney = money ?? moneyInputSchema.parse({});
  const alternative = (kv: number) => draft.alternatives[voltageKey(kv)] ?? emptyAlternative();
  const index = (kv: number) => draft.voltagesKV.indexOf(kv);

  if (draft.voltagesKV.length === 0) return <p className="field-hint">Choose at least one voltage above to set its alternative.</p>;

  const row = (key: string, label: ReactNode, hint: ReactNode, cell: (kv: number) => ReactNode) => (
    <tr key={key}>
      <th scope="row">
        {label}
        {hint ? <span className="ks-row-hint">{hint}</span> : null}
      </th>
      {draft.voltagesKV.map((kv) => (
        <td key={kv}>{cell(kv)}</td>
      ))}
    </tr>
  );

  const estimateFor = (kv: number, lineCostPerKm?: number) =>
    capitalCost(
      {
        voltageKV: kv,
        lines: sectionLines,
        transformers: facing.map((t) => ({ id: t.id, ratedMVA: t.ratedMVA, hvKV: section.facingWindings.some((w) => w.transformerId === t.id && w.winding === "hv") ? kv : t.hvKV })),
      },
      estimateMoney,
      lineCostPerKm === undefined ? {} : { lineCostPerKm },
    ).total;

  return (
    <div className="ks-table-scroll" tabIndex={0} role="region" aria-label="Inputs of each alternative">
      <table className="data-table ks-alt-inputs">
        <thead>
          <tr>
            <th scope="col">Input</th>
            {draft.voltagesKV.map((kv) => (
              <th key={kv} scope="col">
                {kvText(kv)}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {sectionLines.length > 0
            ? row(
                "conductor",
                "Conductor of the section's lines",
                `kept as drawn: ${sectionLines.map((l) => `${fixed(l.rOhmPerKm, 3)} + j${fixed(l.xOhmPerKm, 3)} Ω/km${l.ampacityA ? `, ${l.ampacityA} A` : ""}`).join("; ")}`,
                (kv) => {
                  const alt = alternative(kv);
                  return (
                    <select
                      className="input"
                      aria-label={`Conductor at ${kvText(kv)}`}
                      value={alt.conductorId}
                      onChange={(event) => onChange(kv, { conductorId: event.target.value })}
                    >
                      <option value="">Keep as drawn</option>
                      {options.map((o) => (
                        <option key={o.id} value={o.id}>
                          {o.label}
                        </option>
                      ))}
                      {alt.savedConductor ? <option value={SAVED_CONDUCTOR}>{alt.savedConductor.name ?? "Conductor saved with the study"}</option> : null}
                    </select>
                  );
                },
              )
            : null}
          {facing.map((t) =>
            row(
              `tap-${t.id}`,
              <>
                Tap of {t.name}, <span className="unit">%</span>
              </>,
              `drawn at ${signedPct(t.tapPct)} %${t.tapMinPct !== undefined && t.tapMaxPct !== undefined ? `; range ${signedPct(t.tapMinPct)} to ${signedPct(t.tapMaxPct)} %` : ""}`,
              (kv) => (
                <NumberInput
                  label={`Tap of ${t.name} at ${kvText(kv)}, %`}
                  value={alternative(kv).taps[t.id] ?? ""}
                  placeholder={signedPct(t.tapPct)}
                  error={errors[`overrides[${index(kv)}].transformers.${t.id}.tapPct`]}
                  onChange={(text) => onChange(kv, { taps: { ...alternative(kv).taps, [t.id]: text } })}
                />
              ),
            ),
          )}
          {sectionLines.length > 0
            ? row(
                "line-cost",
                <>
                  Line cost per km, <span className="unit">{estimateMoney.currency}</span>
                </>,
                "empty: from the unit-cost table",
                (kv) => (
                  <NumberInput
                    label={`Line cost per km at ${kvText(kv)}, ${estimateMoney.currency}`}
                    value={alternative(kv).lineCostPerKm}
                    placeholder={Math.round(costAtVoltage(estimateMoney.lineCostPerKmByKV, kv)).toLocaleString("en-GB")}
                    error={errors[`overrides[${index(kv)}].capital.lineCostPerKm`]}
                    onChange={(text) => onChange(kv, { lineCostPerKm: text })}
                  />
                ),
              )
            : null}
          {row(
            "capital",
            <>
              Capital cost of the alternative, <span className="unit">{estimateMoney.currency}</span>
            </>,
            "empty: lines and facing transformers from unit costs",
            (kv) => {
              const perKm = Number(alternative(kv).lineCostPerKm.replace(/[, ]/g, ""));
              const estimate = estimateFor(kv, alternative(kv).lineCostPerKm.trim() && Number.isFinite(perKm) ? perKm : undefined);
              return (
                <NumberInput
                  label={`Capital cost at ${kvText(kv)}, ${estimateMoney.currency}`}
                  value={alternative(kv).capitalCost}
                  placeholder={Math.round(estimate).toLocaleString("en-GB")}
                  error={errors[`overrides[${index(kv)}].capital.capitalCost`]}
                  onChange={(text) => onChange(kv, { capitalCost: text })}
                />
              );
            },
          )}
        </tbody>
      </table>
    </div>
  );
}

function NumberInput({
  label,
  value,
  placeholder,
  error,
  onChange,
}: {
  label: string;
  value: string;
  placeholder: string;
  error?: string;
  onChange: (text: string) => void;
}) {
  const errorId = useId();
  return (
    <div>
      <input
        className="input ks-input-number"
        inputMode="decimal"
        aria-label={label}
        value={value}
        placeholder={placeholder}
        onChange={(event) => onChange(event.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
      />
      <FieldError id={errorId} error={error} />
    </div>
  );
}
