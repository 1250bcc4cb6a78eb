// Pick a transformer or conductor type from the equipment library: the built-in typical types,
// each with its source, plus whatever types the team keeps (passed in by the page).
import { useId, useState } from "react";
import {
  builtInConductorTypes,
  builtInTransformerTypes,
  IEC_60076_5_SOURCE,
  type ConductorType,
  type TransformerType,
} from "#app/lib/equipmentLibrary.ts";

export interface EquipmentTypes {
  transformers?: TransformerType[];
  conductors?: ConductorType[];
}

interface PickerProps<T extends { id: string; label: string; source: string }> {
  label: string;
  builtIn: T[];
  builtInGroup: string;
  extra: T[];
  onPick(type: T): string | undefined;
}

function Picker<T extends { id: string; label: string; source: string }>({ label, builtIn, builtInGroup, extra, onPick }: PickerProps<T>) {
  const selectId = useId();
  const [applied, setApplied] = useState<string | undefined>();
  const all = [...extra, ...builtIn];
  return (
    <div className="ks-field ks-library">
      <label htmlFor={selectId} className="ks-field-label">
        {label}
      </label>
      <select
        id={selectId}
        className="ks-input"
        value=""
        aria-describedby={applied ? `${selectId}-applied` : undefined}
        onChange={(event) => {
          const type = all.find((t) => t.id === event.target.value);
          if (!type) return;
          const note = onPick(type);
          setApplied(`Applied ${type.label} (${type.source})${note ? `; ${note}` : ""}.`);
        }}
      >
        <option value="">Choose a type to apply…</option>
        {extra.length ? (
          <optgroup label="Team library">
            {extra.map((t) => (
              <option key={t.id} value={t.id}>
                {t.label}
              </option>
            ))}
          </optgroup>
        ) : null}
        <optgroup label={builtInGroup}>
          {builtIn.map((t) => (
            <option key={t.id} value={t.id}>
              {t.label}
            </option>
          ))}
        </optgroup>
      </select>
      <p id={`${selectId}-applied`} className="ks-field-hint" aria-live="polite">
        {applied ?? `Built-in types: ${builtInGroup}.`}
      </p>
    </div>
  );
}

export function TransformerTypePicker({ extra, onPick }: { extra?: TransformerType[]; onPick(type: TransformerType): string | undefined }) {
  return (
    <Picker
      label="Transformer type from the library"
      builtIn={builtInTransformerTypes}
      builtInGroup={`typical ratings, ${IEC_60076_5_SOURCE}`}
      extra={extra ?? []}
      onPick={onPick}
    />
  );
}

export function ConductorPicker({ extra, onPick }: { extra?: ConductorType[]; onPick(type: ConductorType): string | undefined }) {
  return (
    <Picker label="Conductor from the library" builtIn={builtInConductorTypes} builtInGroup="typical overhead conductors and XLPE cables, each with its source" extra={extra ?? []} onPick={onPick} />
  );
}
