// The voltage of each alternative along the chain, bus by bus from the source to one end, over
// each bus's allowed band: where a candidate voltage sags or lifts the far end out of its band.
import { chainEnds, chainTo } from "#solver/topology.ts";
import type { Ladder } from "#solver/ladder.ts";
import type { Network } from "#solver/schema.ts";
import { fixed, kvText } from "#app/lib/format.ts";
import { styleOfAlternative } from "./chartParts.tsx";
import { LegendMark } from "./LossPlot.tsx";
import { BAND_EDGE, BAND_FILL, profileRows, VoltageProfileChart, type ProfileSeries } from "./VoltageProfileChart.tsx";

/**
 * The end the profile runs to unless the planner picks another: of the chain's far ends, the
 * one lowest in voltage in the recommended alternative (else the first that solved).
 */
export function defaultProfileEnd(ladder: Ladder, network: Network): string | undefined {
  const ends = chainEnds(network);
  const shown = ladder.alternatives[ladder.cheapest?.index ?? ladder.alternatives.findIndex((a) => a.converged)];
  if (!shown || !shown.converged) return ends[0];
  const vPu = new Map(shown.result.loadFlow.buses.map((b) => [b.id, b.vPu]));
  return [...ends].sort((a, b) => (vPu.get(a) ?? 9) - (vPu.get(b) ?? 9))[0];
}

export function ProfilePlot({
  ladder,
  network,
  endBusId,
  width,
  height = 260,
}: {
  ladder: Ladder;
  network: Network;
  endBusId: string | undefined;
  width?: number;
  height?: number;
}) {
  const chain = endBusId ? chainTo(network, endBusId) : [];
  const carried = ladder.alternatives.map((a, index) => ({ a, index })).filter(({ a }) => a.converged);
  const series: ProfileSeries[] = carried.map(({ a, index }) => ({
    label: kvText(a.voltageKV),
    vPuByBus: new Map(a.result.loadFlow.buses.map((b) => [b.id, b.vPu])),
    style: styleOfAlternative(index),
  }));
  const rows = profileRows(network, chain, series);
  const notCarried = ladder.alternatives.filter((a) => !a.converged);
  const endName = network.buses.find((b) => b.id === endBusId)?.name;

  return (
    <figure className="ks-plot">
      <figcaption className="ks-plot-title">Voltage along the chain{endName ? ` to ${endName}` : ""}</figcaption>
      {rows.length === 0 ? (
        <p className="ks-plot-note">There is no chain from a source to draw.</p>
      ) : (
        <VoltageProfileChart rows={rows} series={series} width={width} height={height} />
      )}
      <ul className="ks-plot-legend">
        {series.map((s) => (
          <li key={s.label}>
            <LegendMark style={s.style} /> {s.label}
          </li>
        ))}
        <li>
          <svg width="28" height="12" aria-hidden="true">
            <rect x="0" y="1" width="28" height="10" fill={BAND_FILL} stroke={BAND_EDGE} strokeDasharray="4 3" />
          </svg>{" "}
          Allowed band of each bus
        </li>
      </ul>
      <p className="ks-plot-note">
        {series.map((s) => `${s.label}: ${fixed(endBusId ? s.vPuByBus.get(endBusId) : undefined, 3)} pu at the end`).join("; ")}
        {carried.length > 0 ? "." : ""}
        {notCarried.length > 0 ? ` ${notCarried.map((a) => kvText(a.voltageKV)).join(", ")} cannot carry the load and has no profile.` : ""}
      </p>
    </figure>
  );
}
