// The study report's tables of the solved network: buses, branches, fault levels and checks,
// every quantity with its unit and every status with an icon and words.
import { statusCue, upperLimitStatus, voltageStatus, type LimitStatus } from "#app/components/sheet/readingStatus.ts";
import { checkLine, fixed, kvText } from "#app/components/ladder/ladderText.ts";
import type { SolveResult } from "#solver/results.ts";
import type { Network } from "#solver/schema.ts";

function Status({ status }: { status: LimitStatus | undefined }) {
  if (!status) return <span className="ks-muted">no limit given</span>;
  const cue = statusCue[status];
  return (
    <span className={`ks-status ks-status-${status}`}>
      <span aria-hidden="true">{cue.icon}</span> {cue.words}
    </span>
  );
}

const nameOf = (network: Network, id: string) => network.buses.find((b) => b.id === id)?.name ?? id;

export function BusTable({ network, result }: { network: Network; result: SolveResult }) {
  const readings = new Map(result.loadFlow.buses.map((b) => [b.id, b]));
  return (
    <table className="data-table ks-report-table">
      <caption>Bus voltages</caption>
      <thead>
        <tr>
          <th scope="col">Bus</th>
          <th scope="col" className="num">
            U<sub>n</sub> <span className="unit">kV</span>
          </th>
          <th scope="col" className="num">
            V <span className="unit">pu</span>
          </th>
          <th scope="col" className="num">
            V <span className="unit">kV</span>
          </th>
          <th scope="col" className="num">
            Angle <span className="unit">°</span>
          </th>
          <th scope="col" className="num">
            Band <span className="unit">pu</span>
          </th>
          <th scope="col">Status</th>
        </tr>
      </thead>
      <tbody>
        {network.buses.map((bus) => {
          const r = readings.get(bus.id);
          return (
            <tr key={bus.id}>
              <th scope="row">{bus.name}</th>
              <td className="num">{fixed(bus.nominalKV, 2)}</td>
              <td className="num">{fixed(r?.vPu, 4)}</td>
              <td className="num">{fixed(r?.vKV, 2)}</td>
              <td className="num">{fixed(r?.angleDeg, 2)}</td>
              <td className="num">
                {fixed(bus.vMinPu, 2)}–{fixed(bus.vMaxPu, 2)}
              </td>
              <td>{r ? <Status status={voltageStatus(r.vPu, bus.vMinPu, bus.vMaxPu)} /> : "–"}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

export function BranchTable({ network, result }: { network: Network; result: SolveResult }) {
  const names = new Map([...network.lines, ...network.transformers].map((e) => [e.id, e.name]));
  const kinds = new Map<string, string>([
    ...network.lines.map((l): [string, string] => [l.id, l.kind === "cable" ? "cable" : "overhead line"]),
    ...network.transformers.map((t): [string, string] => [t.id, "transformer"]),
  ]);
  return (
    <table className="data-table ks-report-table">
      <caption>Branch flows and losses (flows at the first-named end)</caption>
      <thead>
        <tr>
          <th scope="col">Branch</th>
          <th scope="col">From → to</th>
          <th scope="col" className="num">
            P <span className="unit">MW</span>
          </th>
          <th scope="col" className="num">
            Q <span className="unit">Mvar</span>
          </th>
          <th scope="col" className="num">
            I <span className="unit">A</span>
          </th>
          <th scope="col" className="num">
            Loading <span className="unit">%</span>
          </th>
          <th scope="col" className="num">
            Losses <span className="unit">kW</span>
          </th>
          <th scope="col">Status</th>
        </tr>
      </thead>
      <tbody>
        {result.loadFlow.branches.map((b) => (
          <tr key={b.id}>
            <th scope="row">
              {names.get(b.id) ?? b.id}
              <span className="ks-cell-note">{kinds.get(b.id)}</span>
            </th>
            <td>
              {nameOf(network, b.fromBus)} → {nameOf(network, b.toBus)}
            </td>
            <td className="num">{fixed(b.pFromMW, 3)}</td>
            <td className="num">{fixed(b.qFromMvar, 3)}</td>
            <td className="num">{fixed(b.currentA, 1)}</td>
            <td className="num">{fixed(b.loadingPct, 1)}</td>
            <td className="num">{fixed(b.lossKW, 1)}</td>
            <td>
              <Status status={upperLimitStatus(b.loadingPct, b.loadingPct === null ? undefined : 100)} />
            </td>
          </tr>
        ))}
      </tbody>
      <tfoot>
        <tr>
          <th scope="row" colSpan={6}>
            Losses in all (generation {fixed(result.loadFlow.totals.generationMW, 3)} MW, load {fixed(result.loadFlow.totals.loadMW, 3)} MW)
          </th>
          <td className="num">{fixed(result.loadFlow.totals.lossMW * 1000, 1)}</td>
          <td>{fixed(result.loadFlow.totals.lossPct, 2)} % of generation</td>
        </tr>
      </tfoot>
    </table>
  );
}

export function FaultTable({ network, result }: { network: Network; result: SolveResult }) {
  const faults = new Map((result.faults?.buses ?? []).map((f) => [f.id, f]));
  return (
    <table className="data-table ks-report-table">
      <caption>Initial short-circuit currents by IEC 60909-0 (maximum: c<sub>max</sub> 1.10 above 1 kV, 1.05 at or below)</caption>
      <thead>
        <tr>
          <th scope="col">Bus</th>
          <th scope="col" className="num">
            I″k3 <span className="unit">kA</span>
          </th>
          <th scope="col" className="num">
            S″k3 <span className="unit">MVA</span>
          </th>
          <th scope="col" className="num">
            i<sub>p</sub> <span className="unit">kA</span>
          </th>
          <th scope="col" className="num">
            I″k1 <span className="unit">kA</span>
          </th>
          <th scope="col" className="num">R/X</th>
          <th scope="col" className="num">
            Breaking <span className="unit">kA</span>
          </th>
          <th scope="col">Status</th>
        </tr>
      </thead>
      <tbody>
        {network.buses.map((bus) => {
          const f = faults.get(bus.id);
          return (
            <tr key={bus.id}>
              <th scope="row">
                {bus.name}
                <span className="ks-cell-note">{kvText(bus.nominalKV)}</span>
              </th>
              <td className="num">{fixed(f?.ik3kA, 2)}</td>
              <td className="num">{fixed(f?.ik3MVA, 0)}</td>
              <td className="num">{fixed(f?.ip3kA, 2)}</td>
              <td className="num">
                {fixed(f?.ik1kA, 2)}
                {f?.note ? <span className="ks-cell-note">{f.note}</span> : null}
              </td>
              <td className="num">{fixed(f?.rOverX, 3)}</td>
              <td className="num">{fixed(bus.breakingKA, 1)}</td>
              <td>{f ? <Status status={upperLimitStatus(Math.max(f.ik3kA, f.ik1kA), bus.breakingKA)} /> : "–"}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

export function CheckList({ network, result }: { network: Network; result: SolveResult }) {
  if (result.checks.length === 0)
    return (
      <p className="ks-status ks-status-within">
        <span aria-hidden="true">{statusCue.within.icon}</span> Every voltage, loading and breaking current is within its limit.
      </p>
    );
  return (
    <ul className="ks-report-checks">
      {result.checks.map((c, i) => (
        <li key={`${c.element}-${c.kind}-${i}`}>
          <span className="ks-status ks-status-beyond">
            <span aria-hidden="true">{statusCue.beyond.icon}</span> {checkLine(c, network)}
          </span>
          <span className="ks-check-rule">{c.message}</span>
        </li>
      ))}
    </ul>
  );
}
