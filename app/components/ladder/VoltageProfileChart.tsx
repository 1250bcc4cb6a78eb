// The voltage along a chain, bus by bus from the source to one end, over each bus's allowed band:
// one chart for the sheet's results (one line, the present network) and for the ladder and the
// report (one line per alternative).
import { Area, CartesianGrid, ComposedChart, Label, Line, Tooltip, XAxis, YAxis } from "recharts";
import type { Network } from "#solver/schema.ts";
import { fixed } from "#app/lib/format.ts";
import { axisLabel, axisTick, gridStroke, Marker, Sized, type AlternativeStyle } from "./chartParts.tsx";

export const BAND_FILL = "var(--color-ok-wash, #e6f0e3)";
export const BAND_EDGE = "var(--color-ok, #2e7031)";

export interface ProfileSeries {
  label: string;
  vPuByBus: ReadonlyMap<string, number>;
  style: AlternativeStyle;
}

export interface ProfileRow extends Record<string, unknown> {
  busId: string;
  name: string;
  band: [number, number];
}

/** One row per bus of the chain: its name, its band and each series' voltage (`v0`, `v1`, …). */
export function profileRows(network: Network, chain: readonly string[], series: readonly ProfileSeries[]): ProfileRow[] {
  const buses = new Map(network.buses.map((b) => [b.id, b]));
  return chain.flatMap((busId) => {
    const bus = buses.get(busId);
    if (!bus) return [];
    const row: ProfileRow = { busId, name: bus.name, band: [bus.vMinPu, bus.vMaxPu] };
    series.forEach((s, i) => (row[`v${i}`] = s.vPuByBus.get(busId)));
    return [row];
  });
}

/** The voltage axis rounded out to steps a planner reads at a glance: 0.01, 0.02, 0.05, 0.1 or 0.2 pu. */
export function profileTicks(rows: readonly ProfileRow[], seriesCount: number): number[] {
  const values = rows.flatMap((r) => [...r.band, ...Array.from({ length: seriesCount }, (_, i) => r[`v${i}`] as number)]).filter(Number.isFinite);
  const low = values.length ? Math.min(...values) : 0.9;
  const high = values.length ? Math.max(...values) : 1.1;
  const step = [0.01, 0.02, 0.05, 0.1].find((s) => (high - low) / s <= 8) ?? 0.2;
  const bottom = Math.floor((low - step / 2) / step) * step;
  const top = Math.ceil((high + step / 2) / step) * step;
  return Array.from({ length: Math.round((top - bottom) / step) + 1 }, (_, i) => Number((bottom + i * step).toFixed(2)));
}

export function VoltageProfileChart({
  rows,
  series,
  width,
  height,
}: {
  rows: ProfileRow[];
  series: readonly ProfileSeries[];
  width?: number;
  height: number;
}) {
  const ticks = profileTicks(rows, series.length);
  return (
    <Sized width={width} height={height}>
      <ComposedChart data={rows} margin={{ top: 12, right: 24, bottom: 8, left: 8 }}>
        <CartesianGrid stroke={gridStroke} />
        <XAxis dataKey="name" tick={WrappedTick} interval={0} height={40} padding={{ left: 36, right: 36 }} />
        <YAxis domain={[ticks[0], ticks[ticks.length - 1]]} ticks={ticks} tick={axisTick} tickFormatter={(v: number) => fixed(v, 2)} width={52}>
          <Label value="pu" angle={-90} position="insideLeft" style={axisLabel} />
        </YAxis>
        <Area dataKey="band" name="allowed band" stroke={BAND_EDGE} strokeDasharray="4 3" fill={BAND_FILL} isAnimationActive={false} />
        {series.map((s, i) => (
          <Line
            key={s.label}
            dataKey={`v${i}`}
            name={s.label}
            stroke={s.style.colour}
            strokeDasharray={s.style.dash}
            strokeWidth={2}
            dot={(p: { cx?: number; cy?: number; index?: number }) => <Marker key={p.index} cx={p.cx} cy={p.cy} style={s.style} />}
            isAnimationActive={false}
          />
        ))}
        <Tooltip
          formatter={(value) =>
            Array.isArray(value) ? `${fixed(Number(value[0]), 3)}–${fixed(Number(value[1]), 3)} pu` : `${fixed(Number(value), 4)} pu`
          }
        />
      </ComposedChart>
    </Sized>
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
