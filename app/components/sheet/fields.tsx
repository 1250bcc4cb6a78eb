// Inputs of the Details form. A quantity field reads units as typed ("33 kV", "500 V", "25 MVA"),
// says what it understood, and shows a refusal next to the field; nothing is written to the
// network until the value is committed (Enter or leaving the field).
import { useEffect, useId, useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import { unitLabel, type QuantityKind } from "#app/lib/unitFormat.ts";
import { REVERT_FIELD_EVENT, SHEET_FIELD_ATTRIBUTE, UNCOMMITTED_ATTRIBUTE } from "./shortcuts.ts";
import { useUnitParser } from "./unitParser.ts";

/**
 * The text of a field follows the sheet's value whenever that value changes (an undo, a redo, a
 * reload of theirs), even while the field has focus: a field never keeps text the sheet did not
 * put there. Ctrl+Z on a field with uncommitted typing drops that typing (shortcuts.ts).
 */
function useSheetFieldText(shown: string, onRevert: () => void) {
  const [text, setText] = useState(shown);
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => setText(shown), [shown]);
  const revert = useRef(onRevert);
  revert.current = onRevert;
  useEffect(() => {
    const input = ref.current;
    if (!input) return;
    const listener = () => {
      setText(shown);
      revert.current();
    };
    input.addEventListener(REVERT_FIELD_EVENT, listener);
    return () => input.removeEventListener(REVERT_FIELD_EVENT, listener);
  }, [shown]);
  const fieldProps = { ref, [SHEET_FIELD_ATTRIBUTE]: "", [UNCOMMITTED_ATTRIBUTE]: text !== shown ? "" : undefined };
  return { text, setText, fieldProps };
}

function numberText(value: number | undefined): string {
  return value === undefined ? "" : String(Number(value.toPrecision(12)));
}

interface FieldFrameProps {
  inputId: string;
  label: string;
  hint?: string;
  message?: { tone: "error" | "understood"; text: string };
  children: ReactNode;
}

function FieldFrame({ inputId, label, hint, message, children }: FieldFrameProps) {
  return (
    <div className="ks-field">
      <label htmlFor={inputId} className="ks-field-label">
        {label}
      </label>
      {children}
      {message ? (
        <p id={`${inputId}-msg`} className={message.tone === "error" ? "ks-field-error" : "ks-field-understood"} role={message.tone === "error" ? "alert" : undefined}>
          {message.tone === "error" ? <span aria-hidden="true">✕ </span> : null}
          {message.text}
        </p>
      ) : null}
      {hint ? (
        <p id={`${inputId}-hint`} className="ks-field-hint">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

export interface QuantityFieldProps {
  label: string;
  unit: QuantityKind;
  value: number | undefined;
  optional?: boolean;
  hint?: string;
  /** A problem the whole network has with this field (from the network's own rules). */
  externalError?: string;
  /** Returns a refusal in words, or undefined when the value was taken. */
  onCommit(value: number | undefined): string | undefined;
}

export function QuantityField({ label, unit, value, optional, hint, externalError, onCommit }: QuantityFieldProps) {
  const inputId = useId();
  const [error, setError] = useState<string | undefined>();
  const { text, setText, fieldProps } = useSheetFieldText(numberText(value), () => setError(undefined));
  const units = useUnitParser();

  useEffect(() => setError(undefined), [value]);

  const live = units.parse && text.trim() && text.trim() !== numberText(value) ? units.parse(text, unit) : undefined;

  const commit = () => {
    const trimmed = text.trim();
    if (trimmed === numberText(value)) {
      setError(undefined);
      return;
    }
    if (!trimmed) {
      if (!optional) {
        setError("is required");
        return;
      }
      const refused = onCommit(undefined);
      setError(refused);
      return;
    }
    // The reader is fetched on the field's first focus; a value committed before it arrives is read when it does.
    units.whenReady((parseQuantity) => {
      const parsed = parseQuantity(trimmed, unit);
      if (!parsed.ok) {
        setError(parsed.error);
        return;
      }
      const refused = onCommit(parsed.value);
      setError(refused);
      if (!refused) setText(numberText(parsed.value));
    });
  };

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>) => {
    if (event.key === "Enter") {
      event.preventDefault();
      commit();
    } else if (event.key === "Escape") {
      event.preventDefault();
      setText(numberText(value));
      setError(undefined);
    }
  };

  const shownError = error ?? externalError;
  const message = shownError
    ? { tone: "error" as const, text: `${label} ${shownError}` }
    : live?.ok
      ? { tone: "understood" as const, text: live.understood }
      : undefined;
  const describedBy = [message ? `${inputId}-msg` : "", hint ? `${inputId}-hint` : ""].filter(Boolean).join(" ") || undefined;
  return (
    <FieldFrame inputId={inputId} label={label} hint={hint} message={message}>
      <div className="ks-input-row">
        <input
          id={inputId}
          className="ks-input"
          inputMode="text"
          autoComplete="off"
          spellCheck={false}
          value={text}
          placeholder={optional ? "not given" : undefined}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={describedBy}
          {...fieldProps}
          onFocus={units.want}
          onBlur={commit}
          onChange={(event) => setText(event.target.value)}
          onKeyDown={onKeyDown}
        />
        {unitLabel(unit) ? (
          <span className="ks-input-unit" aria-hidden="true">
            {unitLabel(unit)}
          </span>
        ) : null}
      </div>
    </FieldFrame>
  );
}

export function TextField({
  label,
  value,
  externalError,
  onCommit,
}: {
  label: string;
  value: string;
  externalError?: string;
  onCommit(value: string): string | undefined;
}) {
  const inputId = useId();
  const [error, setError] = useState<string | undefined>();
  const { text, setText, fieldProps } = useSheetFieldText(value, () => setError(undefined));
  const commit = () => {
    if (text === value) return setError(undefined);
    const refused = onCommit(text);
    setError(refused);
  };
  const shownError = error ?? externalError;
  return (
    <FieldFrame inputId={inputId} label={label} message={shownError ? { tone: "error", text: `${label} ${shownError}` } : undefined}>
      <input
        id={inputId}
        className="ks-input"
        value={text}
        autoComplete="off"
        aria-invalid={shownError ? true : undefined}
        aria-describedby={shownError ? `${inputId}-msg` : undefined}
        {...fieldProps}
        onBlur={commit}
        onChange={(event) => setText(event.target.value)}
        onKeyDown={(event) => {
          if (event.key === "Enter") {
            event.preventDefault();
            commit();
          } else if (event.key === "Escape") {
            event.preventDefault();
            setText(value);
            setError(undefined);
          }
        }}
      />
    </FieldFrame>
  );
}

export function SelectField({
  label,
  value,
  options,
  externalError,
  onChange,
}: {
  label: string;
  value: string;
  options: { value: string; label: string }[];
  externalError?: string;
  onChange(value: string): void;
}) {
  const inputId = useId();
  return (
    <FieldFrame inputId={inputId} label={label} message={externalError ? { tone: "error", text: `${label}: ${externalError}` } : undefined}>
      <select
        id={inputId}
        {...{ [SHEET_FIELD_ATTRIBUTE]: "" }}
        className="ks-input"
        value={value}
        aria-invalid={externalError ? true : undefined}
        aria-describedby={externalError ? `${inputId}-msg` : undefined}
        onChange={(event) => onChange(event.target.value)}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}

export function ReadOnlyValue({ label, value }: { label: string; value: string }) {
  return (
    <div className="ks-readonly-row">
      <dt>{label}</dt>
      <dd>{value}</dd>
    </div>
  );
}
