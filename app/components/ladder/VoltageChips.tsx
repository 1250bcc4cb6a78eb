// Candidate voltages: the IEC 60038 values offered for the section as toggles, and any other
// voltage typed in (checked before it joins the ladder).
import { useId, useState, type FormEvent } from "react";
import { FieldError } from "#app/components/FormField.tsx";
import { CANDIDATE_RANGE_FACTOR, standardVoltage } from "#solver/iec60038.ts";
import { kvText } from "#app/lib/format.ts";
import { readCandidateVoltage } from "./studyDraft.ts";

export function VoltageChips({
  offeredKV,
  presentKV,
  selectedKV,
  onToggle,
  onAdd,
  error,
}: {
  offeredKV: number[];
  presentKV: number | undefined;
  selectedKV: number[];
  onToggle: (voltageKV: number) => void;
  onAdd: (voltageKV: number) => void;
  error?: string;
}) {
  const headingId = useId();
  const inputId = useId();
  const entryErrorId = `${inputId}-error`;
  const [entry, setEntry] = useState("");
  const [entryError, setEntryError] = useState<string>();
  const chips = [...new Set([...offeredKV, ...selectedKV])].sort((a, b) => a - b);

  const add = (event: FormEvent) => {
    event.preventDefault();
    const read = readCandidateVoltage(entry, selectedKV);
    if (!read.ok) {
      setEntryError(read.error);
      return;
    }
    setEntryError(undefined);
    setEntry("");
    onAdd(read.voltageKV);
  };

  return (
    <div className="ks-voltages">
      <p id={headingId} className="field-hint ks-voltages-hint">
        {presentKV !== undefined
          ? `IEC 60038 voltages from a third to ${CANDIDATE_RANGE_FACTOR} times the present ${kvText(presentKV)}; press one to add or remove it.`
          : "Press a voltage to add or remove it."}
      </p>
      <div role="group" aria-labelledby={headingId} className="ks-chips">
        {chips.map((kv) => {
          const pressed = selectedKV.includes(kv);
          const notes = [kv === presentKV ? "present" : null, standardVoltage(kv) ? null : "not IEC 60038"].filter(Boolean);
          return (
            <button key={kv} type="button" className="ks-chip" aria-pressed={pressed} onClick={() => onToggle(kv)}>
              <span aria-hidden="true" className="ks-chip-mark">
                {pressed ? "✓" : "+"}
              </span>
              {kvText(kv)}
              {notes.length > 0 ? <span className="ks-chip-note"> ({notes.join(", ")})</span> : null}
            </button>
          );
        })}
      </div>
      {error ? (
        <p className="field-error" role="alert">
          {error}
        </p>
      ) : null}
      <div className="ks-voltage-entry">
        <label htmlFor={inputId} className="field-label">
          Another voltage
        </label>
        <div className="ks-inline">
          <input
            id={inputId}
            className="input ks-input-short"
            inputMode="decimal"
            placeholder="e.g. 88 kV"
            value={entry}
            onChange={(event) => setEntry(event.target.value)}
            onKeyDown={(event) => {
              if (event.key === "Enter") add(event);
            }}
            aria-invalid={entryError ? true : undefined}
            aria-describedby={entryError ? entryErrorId : undefined}
          />
          <button type="button" className="btn" onClick={add}>
            Add voltage
          </button>
        </div>
        <FieldError id={entryErrorId} error={entryError} />
      </div>
    </div>
  );
}
