// Choosing the section to re-rate: click a bus on the drawing or pick it from the list; the
// buses, lines and windings the section covers are spelled out under it.
import { useId } from "react";
import { FieldError } from "#app/components/FormField.tsx";
import { SingleLineDrawing } from "#app/components/report/SingleLineDrawing.tsx";
import { DRAWING_MAX_BUSES } from "#app/components/report/singleLineLayout.ts";
import type { Section } from "#solver/ladder.ts";
import type { Line, Network } from "#solver/schema.ts";
import { indexElements } from "#solver/elements.ts";
import { kvText, readingText } from "#app/lib/format.ts";

export function SectionPicker({
  network,
  sectionBus,
  section,
  onPick,
  error,
}: {
  network: Network;
  sectionBus: string;
  section: Section | undefined;
  onPick: (busId: string) => void;
  error?: string;
}) {
  const selectId = useId();
  const errorId = `${selectId}-error`;
  return (
    <div className="ks-section-picker">
      {network.buses.length <= DRAWING_MAX_BUSES ? (
        <div className="ks-drawing-frame">
          <SingleLineDrawing
            network={network}
            highlightBusIds={section?.busIds ?? []}
            onPickBus={onPick}
            pickLabel={(name) => `Re-rate the section of ${name}`}
            label={`Single-line drawing of ${network.name}; each bus is a button that picks its section`}
          />
        </div>
      ) : (
        <p className="text-sm text-ink-soft">
          The drawing is left out: the network has {network.buses.length.toLocaleString("en-GB")} buses, more than the {DRAWING_MAX_BUSES} a page
          can show legibly. Pick the section by one of its buses from the list.
        </p>
      )}
      <div className="ks-section-choice">
        <div>
          <label htmlFor={selectId} className="field-label">
            Bus of the section
          </label>
          <select
            id={selectId}
            className="input"
            value={sectionBus}
            onChange={(event) => onPick(event.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? errorId : undefined}
          >
            {network.buses.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name} ({kvText(b.nominalKV)})
              </option>
            ))}
          </select>
          <FieldError id={errorId} error={error} />
        </div>
        {section ? <SectionSummary network={network} section={section} /> : null}
      </div>
    </div>
  );
}

function SectionSummary({ network, section }: { network: Network; section: Section }) {
  const elements = indexElements(network);
  const name = (id: string) => elements.get(id)?.element.name ?? "an element not in this revision";
  const lines = section.lineIds.flatMap((id) => {
    const entry = elements.get(id);
    return entry?.kind === "line" ? [entry.element as Line] : [];
  });
  return (
    <dl className="ks-section-summary" aria-live="polite">
      <dt>Present voltage</dt>
      <dd>{kvText(section.nominalKV)}</dd>
      <dt>Buses re-rated</dt>
      <dd>{section.busIds.map(name).join(", ")}</dd>
      <dt>Lines</dt>
      <dd>
        {lines.length === 0
          ? "none: only the windings change"
          : lines.map((l) => `${l.name} (${readingText(l.lengthKm, "km")} ${l.kind === "cable" ? "cable" : "overhead"})`).join(", ")}
      </dd>
      <dt>Windings re-rated</dt>
      <dd>
        {section.facingWindings.length === 0
          ? "none"
          : section.facingWindings.map((w) => `${w.winding.toUpperCase()} of ${name(w.transformerId)}`).join(", ")}
      </dd>
      <dt>Fault levels reported at</dt>
      <dd>{section.endBusIds.map(name).join(", ")}</dd>
    </dl>
  );
}
