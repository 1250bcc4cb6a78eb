// The on-load tap changer of a transformer in Details: which bus it holds, the target voltage and
// the band (the contract's tapControl: |V| of the bus within targetPu ± bandPu/2), beside the tap
// range and step fields. Every value goes through the transformer's own schema before it is written.
import type { Network, Transformer } from "#solver/schema.ts";
import { DEFAULT_TAP_RANGE_PCT, DEFAULT_TAP_STEP_PCT } from "#solver/tapControl.ts";
import { QuantityField, ReadOnlyValue, SelectField } from "./fields.tsx";

type TapControl = NonNullable<Transformer["tapControl"]>;

/** A first setting: hold the LV busbar at 1.00 pu in a band two steps wide, so one step cannot jump across it. */
export function defaultTapControl(transformer: Transformer, bus: string): TapControl {
  const stepPct = transformer.tapStepPct ?? DEFAULT_TAP_STEP_PCT;
  return { bus, targetPu: 1, bandPu: Number(((2 * stepPct) / 100).toFixed(4)) };
}

/** What the regulator does, in words: the bus, the band and the range it steps in. */
export function tapControlText(transformer: Transformer, doc: Network): string {
  const control = transformer.tapControl;
  if (!control) return "No: the tap stays as drawn";
  const bus = doc.buses.find((b) => b.id === control.bus)?.name ?? control.bus;
  const half = control.bandPu / 2;
  const min = transformer.tapMinPct ?? -DEFAULT_TAP_RANGE_PCT;
  const max = transformer.tapMaxPct ?? DEFAULT_TAP_RANGE_PCT;
  return `Holds ${bus} at ${control.targetPu} ± ${Number(half.toPrecision(4))} pu (${Number((control.targetPu - half).toPrecision(6))} to ${Number((control.targetPu + half).toPrecision(6))} pu), stepping ${transformer.tapStepPct ?? DEFAULT_TAP_STEP_PCT} % from ${min} to ${max} %`;
}

/**
 * A band narrower than the voltage one step moves (about step % of the target) cannot always be
 * met: the regulator then stops on the nearer side of it. Said beside the band, not refused.
 */
export function narrowBandNote(transformer: Transformer): string | undefined {
  const control = transformer.tapControl;
  if (!control) return undefined;
  const stepPu = ((transformer.tapStepPct ?? DEFAULT_TAP_STEP_PCT) / 100) * control.targetPu;
  if (control.bandPu >= stepPu) return undefined;
  return `narrower than one tap step (about ${Number(stepPu.toPrecision(3))} pu): the tap may stop just outside it`;
}

export function TapControlFields({
  transformer,
  doc,
  readOnly,
  externalError,
  commit,
}: {
  transformer: Transformer;
  doc: Network;
  readOnly: boolean;
  externalError?: string;
  commit(key: string, value: unknown): string | undefined;
}) {
  const control = transformer.tapControl;
  if (readOnly) return <ReadOnlyValue label="Regulating tap changer" value={tapControlText(transformer, doc)} />;
  const ends = new Set([transformer.hvBus, transformer.lvBus]);
  const buses = [...doc.buses].sort((a, b) => Number(ends.has(b.id)) - Number(ends.has(a.id)) || a.name.localeCompare(b.name));
  const set = (patch: Partial<TapControl>) => commit("tapControl", { ...control!, ...patch });
  const narrow = narrowBandNote(transformer);
  return (
    <fieldset className="ks-tap-control">
      <legend className="ks-field-label">On-load tap changer</legend>
      <SelectField
        label="Regulates the voltage of"
        value={control?.bus ?? ""}
        externalError={externalError}
        options={[
          { value: "", label: "Nothing: the tap stays as drawn" },
          ...buses.map((b) => ({ value: b.id, label: `${b.name} · ${b.nominalKV} kV` })),
        ]}
        onChange={(bus) => {
          if (!bus) commit("tapControl", undefined);
          else commit("tapControl", control ? { ...control, bus } : defaultTapControl(transformer, bus));
        }}
      />
      {control ? (
        <>
          <QuantityField
            label="Target voltage"
            unit="pu"
            value={control.targetPu}
            hint="the voltage the tap changer aims the bus at"
            onCommit={(targetPu) => (targetPu === undefined ? "is required" : set({ targetPu }))}
          />
          <QuantityField
            label="Band (whole width)"
            unit="pu"
            value={control.bandPu}
            hint={narrow ? `holds target ± band/2; ${narrow}` : "holds target ± band/2; the tap moves only when the bus leaves it"}
            onCommit={(bandPu) => (bandPu === undefined ? "is required" : set({ bandPu }))}
          />
          <p className="ks-field-hint" role="status">
            {tapControlText(transformer, doc)}.
            {transformer.tapMinPct === undefined || transformer.tapMaxPct === undefined || transformer.tapStepPct === undefined
              ? ` Range or step not given: ±${DEFAULT_TAP_RANGE_PCT} % in ${DEFAULT_TAP_STEP_PCT} % steps is assumed (common practice).`
              : ""}
          </p>
        </>
      ) : null}
    </fieldset>
  );
}
