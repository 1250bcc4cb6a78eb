// Size the selected line or cable: every library type that can be checked (material and
// cross-section known) put in its place, with whether it carries the worst loading, keeps every
// bus beyond it in its band and withstands the fault for the clearing time, and its lifetime cost.
// One click applies the type the planner chooses.
import { useState } from "react";
import { sizeConductor, type SizingOutcome } from "#solver/conductorSizing.ts";
import { moneyInputSchema } from "#solver/economics.ts";
import type { Line } from "#solver/schema.ts";
import { builtInConductorTypes, type ConductorType } from "#app/lib/equipmentLibrary.ts";
import { lineNominalKV, sizingCandidates } from "#app/lib/conductorCandidates.ts";
import { moneyText } from "#app/lib/format.ts";
import { useSheet } from "./sheetStore.ts";

const DEFAULT_CLEARING_S = "0.5";

export function ConductorSizing({ line, teamTypes, onApply }: { line: Line; teamTypes: ConductorType[]; onApply(type: ConductorType): void }) {
  const network = useSheet((s) => (s.solve.kind === "solved" ? s.solve.readings.network : undefined));
  const [clearing, setClearing] = useState(DEFAULT_CLEARING_S);
  const [outcome, setOutcome] = useState<SizingOutcome | null>(null);
  const [applied, setApplied] = useState<string | null>(null);
  const types = [...builtInConductorTypes, ...teamTypes];
  const currency = moneyInputSchema.parse({}).currency;

  const run = () => {
    setApplied(null);
    if (!network || !network.lines.some((l) => l.id === line.id)) {
      setOutcome({ ok: false, message: "The network must solve first (see Checks)." });
      return;
    }
    const clearingTimeS = Number(clearing);
    const candidates = sizingCandidates(types, lineNominalKV(line, network.buses), network.frequencyHz);
    if (candidates.length === 0) {
      setOutcome({ ok: false, message: "No library type says its material and cross-section, so none can be checked for fault withstand." });
      return;
    }
    setOutcome(sizeConductor(network, line.id, candidates, { clearingTimeS }));
  };

  return (
    <details className="ks-sizing">
      <summary>Size this conductor</summary>
      <div className="ks-field">
        <label htmlFor={`sizing-clearing-${line.id}`} className="field-label">
          Fault clearing time (s)
        </label>
        <input id={`sizing-clearing-${line.id}`} className="input" inputMode="decimal" value={clearing} onChange={(e) => setClearing(e.target.value)} />
        <button type="button" className="btn btn-small" onClick={run}>
          List candidates
        </button>
      </div>
      {outcome && !outcome.ok ? <p className="ks-field-error" role="status">{outcome.message}</p> : null}
      {outcome && outcome.ok ? (
        <table className="data-table ks-sizing-table">
          <caption>
            Library types in place of {line.name}: loading, voltage beyond the line and adiabatic withstand (S ≥ I·√t / k), lifetime cost
            (capital plus present value of losses). {outcome.cheapestPassing ? "★ marks the cheapest that passes." : "None passes."}
          </caption>
          <thead>
            <tr>
              <th scope="col">Type</th>
              <th scope="col">Verdict</th>
              <th scope="col">Why</th>
              <th scope="col" className="num">Lifetime cost</th>
              <th scope="col">
                <span className="sr-only">Apply</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {outcome.verdicts.map((v) => {
              const type = types.find((t) => t.id === v.candidateId)!;
              return (
                <tr key={v.candidateId}>
                  <th scope="row">
                    {v.candidateId === outcome.cheapestPassing ? <span aria-label="cheapest that passes">★ </span> : null}
                    {v.label}
                    <span className="ks-cell-note">{type.source}</span>
                  </th>
                  <td className={v.passes ? "ks-status-within" : "ks-status-beyond"}>
                    <span aria-hidden="true">{v.passes ? "✓ " : "✕ "}</span>
                    {v.passes ? "passes" : "fails"}
                  </td>
                  <td>
                    <ul className="ks-sizing-reasons">
                      {v.tests.map((t) => (
                        <li key={t.test}>
                          <span aria-hidden="true">{t.passes ? "✓ " : "✕ "}</span>
                          {t.test}: {t.reason}
                        </li>
                      ))}
                    </ul>
                  </td>
                  <td className="num">{moneyText(v.lifetimeCost, currency)}</td>
                  <td>
                    <button
                      type="button"
                      className="btn btn-small"
                      onClick={() => {
                        onApply(type);
                        setApplied(v.label);
                      }}
                    >
                      Apply
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      ) : null}
      {applied ? <p role="status">Applied {applied}.</p> : null}
    </details>
  );
}
