// Details: the form for the selected element (or the network itself when nothing is selected).
// Every value is checked by the network file's own element schema before it is written.
import { useMemo } from "react";
import { formatQuantity } from "#app/lib/unitFormat.ts";
import type { Line, Load, Network, Transformer } from "#solver/schema.ts";
import { documentIssues, type SheetIssue } from "./documentIssues.ts";
import { checkField, fieldsFor, type FieldDef } from "./elementFields.ts";
import { applyConductorType, applyTransformerType } from "./equipmentApply.ts";
import { ConductorPicker, TransformerTypePicker, type EquipmentTypes } from "./EquipmentPicker.tsx";
import { ConductorSizing } from "./ConductorSizing.tsx";
import { TapControlFields } from "./TapControlFields.tsx";
import { QuantityField, ReadOnlyValue, SelectField, TextField } from "./fields.tsx";
import { parseWireId, terminalField, wireId } from "./flowModel.ts";
import { describeElement, indexElements, type AnyElement, type ElementEntry } from "#app/lib/networkElements.ts";
import { perUnitNotes } from "./perUnitNotes.ts";
import { deleteItems } from "./sheetEdits.ts";
import { useSheet, useSheetActions } from "./sheetStore.ts";

/** The field after which the per-unit equivalent is printed. */
function perUnitAfter(entry: ElementEntry): string | undefined {
  if (entry.kind === "line") return "xOhmPerKm";
  if (entry.kind === "transformer") return "impedancePct";
  if (entry.kind === "source") return (entry.element as { kind: string }).kind === "grid" ? "shortCircuitMVA" : "xdSubtransientPct";
  return undefined;
}

function valueText(field: FieldDef, element: AnyElement, doc: Network): string {
  const value = (element as unknown as Record<string, unknown>)[field.key];
  if (field.type === "quantity") return typeof value === "number" ? formatQuantity(value, field.unit) : "not given";
  if (field.type === "bus") {
    const bus = doc.buses.find((b) => b.id === value);
    return bus ? `${bus.name} (${bus.nominalKV} kV)` : "not connected";
  }
  if (field.type === "choice") return field.choices.find((c) => c.value === value)?.label ?? String(value ?? "");
  return String(value ?? "");
}

function ElementForm({ entry, doc, readOnly, issues, library }: { entry: ElementEntry; doc: Network; readOnly: boolean; issues: SheetIssue[]; library: EquipmentTypes }) {
  const actions = useSheetActions();
  const fields = fieldsFor(entry.kind, entry.element);
  const notes = perUnitNotes(entry.kind, entry.element, doc);
  const notesAfter = perUnitAfter(entry);
  const record = entry.element as unknown as Record<string, unknown>;
  const issueFor = (key: string) => issues.find((i) => i.field === key)?.message;
  const loose = issues.filter((i) => !i.field || !fields.some((f) => f.key === i.field));

  const commit = (key: string, value: unknown): string | undefined => {
    const checked = checkField(entry.kind, entry.element, key, value);
    if (!checked.ok) return checked.message;
    actions.updateElement(entry.element.id, checked.element);
    return undefined;
  };

  const perUnit = notes.length ? (
    <div className="ks-perunit" aria-label="Per-unit equivalent">
      {notes.map((note) => (
        <p key={note}>{note}</p>
      ))}
    </div>
  ) : null;

  if (readOnly) {
    return (
      <dl className="ks-readonly">
        {fields.map((field) => (
          <div key={field.key}>
            <ReadOnlyValue label={field.label} value={valueText(field, entry.element, doc)} />
            {field.key === notesAfter ? perUnit : null}
            {field.key === "tapStepPct" ? <TapControlFields transformer={entry.element as Transformer} doc={doc} readOnly commit={() => undefined} /> : null}
          </div>
        ))}
      </dl>
    );
  }

  const busOptions = [
    { value: "", label: "Not connected" },
    ...[...doc.buses].sort((a, b) => a.name.localeCompare(b.name)).map((b) => ({ value: b.id, label: `${b.name} · ${b.nominalKV} kV` })),
  ];

  return (
    <div className="ks-form">
      {loose.length ? (
        <ul className="ks-element-issues">
          {loose.map((issue) => (
            <li key={issue.message}>
              <span aria-hidden="true">✕ </span>
              {issue.message}
            </li>
          ))}
        </ul>
      ) : null}
      {entry.kind === "transformer" ? (
        <TransformerTypePicker
          extra={library.transformers}
          onPick={(type) => {
            actions.updateElement(entry.element.id, applyTransformerType(entry.element as Transformer, type));
            return undefined;
          }}
        />
      ) : null}
      {entry.kind === "line" ? (
        <ConductorPicker
          extra={library.conductors}
          onPick={(conductor) => {
            const applied = applyConductorType(entry.element as Line, conductor, doc.frequencyHz);
            actions.updateElement(entry.element.id, applied.line);
            return applied.note;
          }}
        />
      ) : null}
      {entry.kind === "line" ? (
        <ConductorSizing
          line={entry.element as Line}
          teamTypes={library.conductors ?? []}
          onApply={(conductor) => actions.updateElement(entry.element.id, applyConductorType(entry.element as Line, conductor, doc.frequencyHz).line)}
        />
      ) : null}
      {fields.map((field) => {
        let input;
        if (field.type === "quantity")
          input = (
            <QuantityField
              label={field.label}
              unit={field.unit}
              value={record[field.key] as number | undefined}
              optional={field.optional}
              hint={field.hint}
              externalError={issueFor(field.key)}
              onCommit={(value) => commit(field.key, value)}
            />
          );
        else if (field.type === "text")
          input = (
            <TextField
              label={field.label}
              value={String(record[field.key] ?? "")}
              externalError={issueFor(field.key)}
              onCommit={(value) => commit(field.key, value)}
            />
          );
        else if (field.type === "choice")
          input = (
            <SelectField
              label={field.label}
              value={String(record[field.key])}
              options={field.choices}
              externalError={issueFor(field.key)}
              onChange={(value) => commit(field.key, value)}
            />
          );
        else
          input = (
            <SelectField
              label={field.label}
              value={String(record[field.key] ?? "")}
              options={busOptions}
              externalError={issueFor(field.key)}
              onChange={(busId) => {
                if (busId) actions.connect(entry.element.id, field.terminal, busId);
                else actions.edit((content) => deleteItems(content, [wireId(entry.element.id, field.terminal)]));
              }}
            />
          );
        return (
          <div key={field.key}>
            {input}
            {field.key === "tapPct" ? <TapButtons transformer={entry.element as Transformer} commit={commit} /> : null}
            {field.key === "tapStepPct" ? (
              <TapControlFields
                transformer={entry.element as Transformer}
                doc={doc}
                readOnly={false}
                externalError={issues.find((i) => i.field === "tapControl")?.message}
                commit={commit}
              />
            ) : null}
            {entry.kind === "load" && field.key === "pMW" ? <PowerFactorField load={entry.element as Load} commit={commit} /> : null}
            {field.key === notesAfter ? perUnit : null}
          </div>
        );
      })}
    </div>
  );
}

/** cos φ = P / √(P² + Q²); undefined without a flow of active power. */
export function loadPowerFactor(load: Pick<Load, "pMW" | "qMvar">): number | undefined {
  const apparent = Math.hypot(load.pMW, load.qMvar);
  return apparent > 0 && load.pMW !== 0 ? Number((Math.abs(load.pMW) / apparent).toPrecision(4)) : undefined;
}

/** Q for a power factor at the load's P: Q = P · tan(acos(cos φ)), lagging (Q > 0) unless Q was leading. */
export function reactiveForPowerFactor(load: Pick<Load, "pMW" | "qMvar">, powerFactor: number): number {
  const q = Math.abs(load.pMW) * Math.tan(Math.acos(powerFactor));
  return Number((load.qMvar < 0 ? -q : q).toPrecision(10));
}

/** Planners often know a load's power factor rather than its Q: typing one sets Q at this P. */
function PowerFactorField({ load, commit }: { load: Load; commit(key: string, value: unknown): string | undefined }) {
  return (
    <QuantityField
      label="Power factor cos φ"
      unit="ratio"
      value={loadPowerFactor(load)}
      optional
      hint={load.qMvar < 0 ? "leading; sets the reactive power Q at this P" : "lagging; sets the reactive power Q at this P"}
      onCommit={(value) => {
        if (value === undefined) return undefined;
        if (!(value > 0 && value <= 1)) return "must be above 0 and at most 1";
        if (load.pMW === 0) return "needs an active power P first";
        return commit("qMvar", reactiveForPowerFactor(load, value));
      }}
    />
  );
}

function TapButtons({ transformer, commit }: { transformer: Transformer; commit(key: string, value: unknown): string | undefined }) {
  const step = transformer.tapStepPct;
  if (!step) return null;
  const move = (direction: 1 | -1) => {
    const next = Number((transformer.tapPct + direction * step).toPrecision(10));
    if (transformer.tapMinPct !== undefined && next < transformer.tapMinPct - 1e-9) return;
    if (transformer.tapMaxPct !== undefined && next > transformer.tapMaxPct + 1e-9) return;
    commit("tapPct", next);
  };
  return (
    <div className="ks-tap-buttons">
      <button type="button" className="btn btn-small" onClick={() => move(-1)} disabled={transformer.tapMinPct !== undefined && transformer.tapPct - step < transformer.tapMinPct - 1e-9}>
        Tap down {step} %
      </button>
      <button type="button" className="btn btn-small" onClick={() => move(1)} disabled={transformer.tapMaxPct !== undefined && transformer.tapPct + step > transformer.tapMaxPct + 1e-9}>
        Tap up {step} %
      </button>
    </div>
  );
}

function NetworkForm({ doc, readOnly }: { doc: Network; readOnly: boolean }) {
  const actions = useSheetActions();
  if (readOnly)
    return (
      <dl className="ks-readonly">
        <ReadOnlyValue label="Name" value={doc.name} />
        <ReadOnlyValue label="Frequency" value={`${doc.frequencyHz} Hz`} />
        <ReadOnlyValue label="Power base" value={`${doc.baseMVA} MVA`} />
      </dl>
    );
  return (
    <div className="ks-form">
      <TextField
        label="Network name"
        value={doc.name}
        onCommit={(value) => {
          const name = value.trim();
          if (!name) return "must not be empty";
          if (name.length > 200) return "must be at most 200 characters";
          actions.updateNetwork({ name });
          return undefined;
        }}
      />
      <SelectField
        label="Frequency"
        value={String(doc.frequencyHz)}
        options={[
          { value: "50", label: "50 Hz" },
          { value: "60", label: "60 Hz" },
        ]}
        onChange={(value) => actions.updateNetwork({ frequencyHz: value === "60" ? 60 : 50 })}
      />
      <QuantityField
        label="Power base"
        unit="MVA"
        value={doc.baseMVA}
        hint="per-unit values refer to this; 100 MVA is usual"
        onCommit={(value) => {
          if (value === undefined || value <= 0) return "must be more than 0";
          actions.updateNetwork({ baseMVA: value });
          return undefined;
        }}
      />
    </div>
  );
}

export function DetailsPanel({ library = {} }: { library?: EquipmentTypes }) {
  const doc = useSheet((s) => s.document);
  const selection = useSheet((s) => s.selection);
  const readOnly = useSheet((s) => s.readOnly);
  const actions = useSheetActions();
  const entries = useMemo(() => indexElements(doc), [doc]);
  const issues = useMemo(() => documentIssues(doc), [doc]);
  const selected = selection.filter((id) => entries.has(id) || parseWireId(id));

  let body;
  let title = "Network";
  if (selected.length === 0) {
    body = (
      <>
        <p className="ks-panel-note">Nothing is selected: these are the network's own settings. Select an element on the sheet to edit it.</p>
        <NetworkForm doc={doc} readOnly={readOnly} />
      </>
    );
  } else if (selected.length > 1) {
    title = `${selected.length} items selected`;
    body = (
      <div className="ks-form">
        <p className="ks-panel-note">Move them together on the sheet, or:</p>
        {readOnly ? null : (
          <div className="ks-button-row">
            <button type="button" className="btn btn-small" onClick={() => actions.copySelection()}>
              Copy
            </button>
            <button type="button" className="btn btn-small btn-danger" onClick={() => actions.deleteSelection()}>
              Delete
            </button>
          </div>
        )}
      </div>
    );
  } else {
    const wire = parseWireId(selected[0]);
    const entry = wire ? entries.get(wire.elementId) : entries.get(selected[0]);
    if (!entry) body = null;
    else if (wire) {
      const bus = doc.buses.find((b) => b.id === (entry.element as unknown as Record<string, string>)[terminalField[wire.terminal]]);
      title = "Connection";
      body = (
        <div className="ks-form">
          <p>
            {describeElement(entry)} is connected to busbar {bus?.name ?? "?"}.
          </p>
          {readOnly ? null : (
            <button type="button" className="btn btn-small btn-danger" onClick={() => actions.deleteSelection()}>
              Disconnect
            </button>
          )}
        </div>
      );
    } else {
      title = describeElement(entry);
      body = (
        <ElementForm
          key={entry.element.id}
          entry={entry}
          doc={doc}
          readOnly={readOnly}
          issues={issues.filter((i) => i.elementId === entry.element.id)}
          library={library}
        />
      );
    }
  }

  return (
    <section className="ks-panel ks-details" aria-labelledby="ks-details-title">
      <header className="ks-panel-head">
        <h2 id="ks-details-title">Details</h2>
        <p className="ks-panel-sub">{title}</p>
      </header>
      <div className="ks-panel-body">{body}</div>
    </section>
  );
}
