// The voltage of each alternative along the chain, bus by bus from the source to one end, over
// each bus's allowed band: where a candidate voltage sags or lifts the far end out of its band.
import { Area, CartesianGrid, ComposedChart, Label, Line, XAxis, YAxis } from "recharts";
import { chainEnds, chainTo } from "#solver/topology.ts";
import type { Ladder } from "#solver/ladder.ts";
import type { Network } from "#solver/schema.ts";
import { axisLabel, axisTick, gridStroke, Marker, Sized, styleOfAlternative } from "./chartParts.tsx";
import { LegendMark } from "./LossPlot.tsx";
import { fixed, kvText } from "#app/lib/format.ts";

const BAND_FILL = "var(--color-ok-wash, #e6f0e3)";
const BAND_EDGE = "var(--color-ok, #2e7031)";

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
  const path = endBusId ? chainTo(network, endBusId) : [];
  const carried = ladder.alternatives.map((a, index) => ({ a, index })).filter(({ a }) => a.converged);
  const rows = path.map((busId) => {
    const bus = network.buses.find((b) => b.id === busId)!;
    const row: Record<string, unknown> = { name: bus.name, band: [bus.vMinPu, bus.vMaxPu] };
    for (const { a, index } of carried) row[`v${index}`] = a.result.loadFlow.buses.find((b) => b.id === busId)?.vPu;
    return row;
  });
  const values = rows.flatMap((r) => [...(r.band as number[]), ...carried.map(({ index }) => r[`v${index}`] as number)]).filter(Number.isFinite);
  const low = values.length ? Math.min(...values) : 0.9;
  const high = values.length ? Math.max(...values) : 1.1;
  const pad = Math.max(0.01, (high - low) * 0.12);
  const notCarried = ladder.alternatives.filter((a) => !a.converged);
  const endName = network.buses.find((b) => b.id === endBusId)?.name;

  return (
    <figure className="ks-plot">
      <figcaption className="ks-plot-title">Voltage along the chain{endName ? ` to ${endName}` : ""}</figcaption>
      {rows.length === 0 ? (
        <p className="ks-plot-note">There is no chain from a source to draw.</p>
      ) : (
        <Sized width={width} height={height}>
          <ComposedChart data={rows} margin={{ top: 12, right: 24, bottom: 8, left: 8 }}>
            <CartesianGrid stroke={gridStroke} />
            <XAxis dataKey="name" tick={WrappedTick} interval={0} height={40} padding={{ left: 36, right: 36 }} />
            <YAxis
              domain={[Number((low - pad).toFixed(3)), Number((high + pad).toFixed(3))]}
              tick={axisTick}
              tickFormatter={(v: number) => fixed(v, 2)}
              width={52}
            >
              <Label value="pu" angle={-90} position="insideLeft" style={axisLabel} />
            </YAxis>
            <Area dataKey="band" name="allowed band" stroke={BAND_EDGE} strokeDasharray="4 3" fill={BAND_FILL} isAnimationActive={false} />
            {carried.map(({ a, index }) => {
              const style = styleOfAlternative(index);
              return (
                <Line
                  key={a.voltageKV}
                  dataKey={`v${index}`}
                  name={kvText(a.voltageKV)}
                  stroke={style.colour}
                  strokeDasharray={style.dash}
                  strokeWidth={2}
                  dot={(p: { cx?: number; cy?: number; index?: number }) => <Marker key={p.index} cx={p.cx} cy={p.cy} style={style} />}
                  isAnimationActive={false}
                />
              );
            })}
          </ComposedChart>
        </Sized>
      )}
      <ul className="ks-plot-legend">
        {carried.map(({ a, index }) => (
          <li key={a.voltageKV}>
            <LegendMark style={styleOfAlternative(index)} /> {kvText(a.voltageKV)}
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
        {carried
          .map(({ a }) => {
            const end = endBusId ? a.result.loadFlow.buses.find((b) => b.id === endBusId)?.vPu : undefined;
            return `${kvText(a.voltageKV)}: ${fixed(end, 3)} pu at the end`;
          })
          .join("; ")}
        {carried.length > 0 ? "." : ""}
        {notCarried.length > 0 ? ` ${notCarried.map((a) => kvText(a.voltageKV)).join(", ")} cannot carry the load and has no profile.` : ""}
      </p>
    </figure>
  );
}

const TICK_LINE_CHARACTERS = 14;

/** A bus name under its tick on up to two lines, so neighbouring names do not run together. */
function WrappedTick({ x: xAt, y: yAt, payload }: { x: number | string; y: number | string; payload: { value?: unknown } }) {
  const x = Number(xAt);
  const y = Number(yAt);
  const lines: string[] = [];
  // A voltage stays with its unit: "11 kV" is one word here.
  for (const word of String(payload?.value ?? "").split(/\s+(?!kV\b)/)) {
    const last = lines[lines.length - 1];
    if (last !== undefined && (lines.length === 2 || `${last} ${word}`.length <= TICK_LINE_CHARACTERS)) lines[lines.length - 1] = `${last} ${word}`;
    else lines.push(word);
  }
  return (
    <text x={x} y={y + 12} textAnchor="middle" fontSize={11} fill="var(--color-ink-soft, #3f4b59)">
      {lines.map((line, i) => (
        <tspan key={i} x={x} dy={i === 0 ? 0 : 13}>
          {line}
        </tspan>
      ))}
    </text>
  );
}
