import type { ReactNode } from "react";
import { formatNumber } from "#app/lib/format.ts";
import { VOLTAGE_CLASS_LABEL, voltageClass } from "#app/lib/voltage-class.ts";
import type { Network } from "#solver/schema.ts";

const CLASS_COLOUR = {
  lv: "var(--color-kv-lv)",
  mv: "var(--color-kv-mv)",
  hv: "var(--color-kv-hv)",
  ehv: "var(--color-kv-ehv)",
} as const;

function Th({ label, unit, num }: { label: ReactNode; unit?: string; num?: boolean }) {
  return (
    <th scope="col" className={num ? "num" : undefined}>
      {label}
      {unit ? <span className="unit"> ({unit})</span> : null}
    </th>
  );
}

function Num({ value, digits }: { value: number | null | undefined; digits?: number }) {
  return <td className="num">{formatNumber(value, digits)}</td>;
}

function Section({ id, title, count, children }: { id: string; title: string; count: number; children: ReactNode }) {
  return (
    <section aria-labelledby={`${id}-title`} className="panel overflow-x-auto" id={id} tabIndex={0}>
      <h2 id={`${id}-title`} className="flex items-baseline gap-2 px-4 pt-4 text-lg">
        {title}
        <span className="text-sm font-normal text-ink-muted">{count}</span>
      </h2>
      {count === 0 ? <p className="px-4 pb-4 pt-1 text-ink-muted">None in this network.</p> : <div className="pb-2">{children}</div>}
    </section>
  );
}

function VoltageClassTag({ nominalKV }: { nominalKV: number }) {
  const cls = voltageClass(nominalKV);
  return (
    <span className="inline-flex items-center gap-1.5 text-sm font-semibold" style={{ color: CLASS_COLOUR[cls] }}>
      <span aria-hidden="true" className="inline-block h-2.5 w-2.5 rounded-sm" style={{ background: CLASS_COLOUR[cls] }} />
      {VOLTAGE_CLASS_LABEL[cls]}
    </span>
  );
}

/** The network file's elements as readable tables by kind, every quantity with its unit. */
export function NetworkTables({ network }: { network: Network }) {
  const busName = new Map(network.buses.map((b) => [b.id, b.name]));
  const bus = (id: string) => busName.get(id) ?? id;
  const kinds = [
    { id: "buses", title: "Buses", count: network.buses.length },
    { id: "sources", title: "Sources", count: network.sources.length },
    { id: "transformers", title: "Transformers", count: network.transformers.length },
    { id: "lines", title: "Lines and cables", count: network.lines.length },
    { id: "loads", title: "Loads", count: network.loads.length },
    { id: "shunts", title: "Shunts", count: network.shunts.length },
  ];

  return (
    <div className="space-y-6">
      <nav aria-label="Element kinds" className="flex flex-wrap gap-2">
        {kinds.map((k) => (
          <a key={k.id} href={`#${k.id}`} className="btn btn-small">
            {k.title} <span className="text-ink-muted">{k.count}</span>
          </a>
        ))}
        <span className="ml-auto self-center text-sm text-ink-muted">
          {network.frequencyHz} Hz · base {formatNumber(network.baseMVA)} MVA
        </span>
      </nav>

      <Section id="buses" title="Buses" count={network.buses.length}>
        <table className="data-table">
          <thead>
            <tr>
              <Th label="Name" />
              <Th label="Id" />
              <Th label="Class" />
              <Th label="Nominal voltage" unit="kV" num />
              <Th label="Voltage band" unit="pu" num />
              <Th label="Switchgear breaking current" unit="kA" num />
            </tr>
          </thead>
          <tbody>
            {network.buses.map((b) => (
              <tr key={b.id}>
                <td className="whitespace-nowrap font-medium">{b.name}</td>
                <td className="font-mono text-sm text-ink-soft">{b.id}</td>
                <td>
                  <VoltageClassTag nominalKV={b.nominalKV} />
                </td>
                <Num value={b.nominalKV} />
                <td className="num">
                  {formatNumber(b.vMinPu)} – {formatNumber(b.vMaxPu)}
                </td>
                <Num value={b.breakingKA} />
              </tr>
            ))}
          </tbody>
        </table>
      </Section>

      <Section id="sources" title="Sources" count={network.sources.length}>
        <table className="data-table">
          <thead>
            <tr>
              <Th label="Name" />
              <Th label="Bus" />
              <Th label="Type" />
              <Th label="Control" />
              <Th label="Set voltage" unit="pu" num />
              <Th label="P" unit="MW" num />
              <Th label="Q" unit="Mvar" num />
              <Th label="Fault infeed S″k" unit="MVA" num />
              <Th label="Rating" unit="MVA" num />
              <Th label="X″d" unit="%" num />
              <Th label="X/R" num />
            </tr>
          </thead>
          <tbody>
            {network.sources.map((s) => (
              <tr key={s.id}>
                <td className="whitespace-nowrap font-medium">{s.name}</td>
                <td>{bus(s.bus)}</td>
                <td>{s.kind === "grid" ? "Grid infeed" : "Generator"}</td>
                <td>{s.control === "slack" ? "Slack" : s.control.toUpperCase()}</td>
                <Num value={s.control === "pq" ? null : s.voltagePu} />
                <Num value={s.control === "slack" ? null : s.pMW} />
                <Num value={s.control === "pq" ? s.qMvar : null} />
                <Num value={s.shortCircuitMVA} />
                <Num value={s.ratedMVA} />
                <Num value={s.xdSubtransientPct} />
                <Num value={s.xOverR} />
              </tr>
            ))}
          </tbody>
        </table>
      </Section>

      <Section id="transformers" title="Transformers" count={network.transformers.length}>
        <table className="data-table">
          <thead>
            <tr>
              <Th label="Name" />
              <Th label="HV bus → LV bus" />
              <Th label="Rating" unit="MVA" num />
              <Th label="Windings" unit="kV" num />
              <Th label="Impedance uk" unit="%" num />
              <Th label="X/R" num />
              <Th label="Load loss" unit="kW" num />
              <Th label="No-load loss" unit="kW" num />
              <Th label="Tap" unit="%" num />
              <Th label="Tap range" unit="%" num />
              <Th label="Vector group" />
            </tr>
          </thead>
          <tbody>
            {network.transformers.map((t) => (
              <tr key={t.id}>
                <td className="whitespace-nowrap font-medium">{t.name}</td>
                <td>
                  {bus(t.hvBus)} → {bus(t.lvBus)}
                </td>
                <Num value={t.ratedMVA} />
                <td className="num">
                  {formatNumber(t.hvKV)} / {formatNumber(t.lvKV)}
                </td>
                <Num value={t.impedancePct} />
                <Num value={t.xOverR} />
                <Num value={t.loadLossKW} />
                <Num value={t.noLoadLossKW} />
                <Num value={t.tapPct} />
                <td className="num">
                  {t.tapMinPct !== undefined && t.tapMaxPct !== undefined
                    ? `${formatNumber(t.tapMinPct)} to ${formatNumber(t.tapMaxPct)}${t.tapStepPct !== undefined ? ` by ${formatNumber(t.tapStepPct)}` : ""}`
                    : "–"}
                </td>
                <td className="font-mono text-sm">{t.vectorGroup}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Section>

      <Section id="lines" title="Lines and cables" count={network.lines.length}>
        <table className="data-table">
          <thead>
            <tr>
              <Th label="Name" />
              <Th label="From → to" />
              <Th label="Kind" />
              <Th label="Length" unit="km" num />
              <Th label="R" unit="Ω/km" num />
              <Th label="X" unit="Ω/km" num />
              <Th label="B" unit="µS/km" num />
              <Th label="Ampacity" unit="A" num />
            </tr>
          </thead>
          <tbody>
            {network.lines.map((l) => (
              <tr key={l.id}>
                <td className="whitespace-nowrap font-medium">{l.name}</td>
                <td>
                  {bus(l.fromBus)} → {bus(l.toBus)}
                </td>
                <td>{l.kind === "cable" ? "Cable" : "Overhead line"}</td>
                <Num value={l.lengthKm} />
                <Num value={l.rOhmPerKm} digits={4} />
                <Num value={l.xOhmPerKm} digits={4} />
                <Num value={l.bMicroSiemensPerKm} />
                <Num value={l.ampacityA} />
              </tr>
            ))}
          </tbody>
        </table>
      </Section>

      <Section id="loads" title="Loads" count={network.loads.length}>
        <table className="data-table">
          <thead>
            <tr>
              <Th label="Name" />
              <Th label="Bus" />
              <Th label="P" unit="MW" num />
              <Th label="Q" unit="Mvar" num />
              <Th label="Power factor" num />
              <Th label="Model" />
            </tr>
          </thead>
          <tbody>
            {network.loads.map((ld) => {
              const apparentMVA = Math.hypot(ld.pMW, ld.qMvar);
              const powerFactor = apparentMVA > 0 ? Math.abs(ld.pMW) / apparentMVA : null;
              return (
                <tr key={ld.id}>
                  <td className="whitespace-nowrap font-medium">{ld.name}</td>
                  <td>{bus(ld.bus)}</td>
                  <Num value={ld.pMW} />
                  <Num value={ld.qMvar} />
                  <td className="num">
                    {formatNumber(powerFactor, 3)}
                    {powerFactor !== null && ld.qMvar !== 0 ? (
                      <span className="text-ink-muted"> {ld.qMvar > 0 ? "lagging" : "leading"}</span>
                    ) : null}
                  </td>
                  <td>{ld.model.replace("constant-", "constant ")}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </Section>

      <Section id="shunts" title="Shunts" count={network.shunts.length}>
        <table className="data-table">
          <thead>
            <tr>
              <Th label="Name" />
              <Th label="Bus" />
              <Th label="Q at 1 pu" unit="Mvar" num />
              <Th label="Kind" />
            </tr>
          </thead>
          <tbody>
            {network.shunts.map((sh) => (
              <tr key={sh.id}>
                <td className="whitespace-nowrap font-medium">{sh.name}</td>
                <td>{bus(sh.bus)}</td>
                <Num value={sh.qMvar} />
                <td>{sh.qMvar >= 0 ? "Capacitor" : "Reactor"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Section>
    </div>
  );
}
