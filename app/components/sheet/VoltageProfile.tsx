// The voltage profile along the chain, from the slack source to a chosen end bus, with each
// bus's allowed band drawn behind the line. Loaded on demand: the chart library is large.
import { useId, useMemo, useState } from "react";
import { Area, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { Network } from "#solver/schema.ts";
import { chainEnds, chainTo } from "#solver/topology.ts";
import { fixed } from "#app/lib/format.ts";
import { statusCue, voltageStatus } from "#app/lib/limitStatus.ts";
import type { Readings } from "./sheetStore.ts";

export default function VoltageProfile({ document, readings }: { document: Network; readings: Readings }) {
  const selectId = useId();
  const ends = useMemo(() => chainEnds(document), [document]);
  const lowest = useMemo(() => {
    const candidates = ends.length ? ends : document.buses.map((b) => b.id);
    return [...candidates].sort((a, b) => (readings.buses.get(a)?.vPu ?? 9) - (readings.buses.get(b)?.vPu ?? 9))[0];
  }, [ends, document, readings]);
  const [end, setEnd] = useState<string | undefined>();
  const endBus = end && document.buses.some((b) => b.id === end) ? end : lowest;
  const rows = useMemo(() => {
    if (!endBus) return [];
    return chainTo(document, endBus).flatMap((id) => {
      const bus = document.buses.find((b) => b.id === id)!;
      const reading = readings.buses.get(id);
      if (!reading) return [];
      return [{ name: bus.name, vPu: reading.vPu, band: [bus.vMinPu, bus.vMaxPu] as [number, number], status: voltageStatus(reading.vPu, bus.vMinPu, bus.vMaxPu) }];
    });
  }, [document, readings, endBus]);

  if (!rows.length) return <p className="ks-panel-note">There is no chain from a slack source to draw yet.</p>;
  // Round the scale out to steps a planner reads at a glance: 0.01, 0.02 or 0.05 pu.
  const low = Math.min(...rows.map((r) => Math.min(r.vPu, r.band[0])));
  const high = Math.max(...rows.map((r) => Math.max(r.vPu, r.band[1])));
  const step = [0.01, 0.02, 0.05, 0.1].find((s) => (high - low) / s <= 8) ?? 0.2;
  const bottom = Math.floor((low - step / 2) / step) * step;
  const top = Math.ceil((high + step / 2) / step) * step;
  const ticks = Array.from({ length: Math.round((top - bottom) / step) + 1 }, (_, i) => Number((bottom + i * step).toFixed(2)));

  return (
    <div className="ks-profile">
      <div className="ks-field ks-profile-pick">
        <label htmlFor={selectId} className="ks-field-label">
          Chain from the slack source to
        </label>
        <select id={selectId} className="ks-input" value={endBus} onChange={(event) => setEnd(event.target.value)}>
          {document.buses.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
            </option>
          ))}
        </select>
      </div>
      <figure className="ks-profile-figure">
        <div style={{ width: "100%", height: 220 }}>
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart data={rows} margin={{ top: 10, right: 24, bottom: 4, left: 8 }}>
              <CartesianGrid stroke="var(--color-paper-rule, #e6e1d5)" />
              <XAxis dataKey="name" tick={{ fontSize: 12, fill: "var(--color-ink-soft, #3f4b59)" }} interval={0} padding={{ left: 40, right: 60 }} />
              <YAxis
                domain={[ticks[0], ticks[ticks.length - 1]]}
                ticks={ticks}
                tick={{ fontSize: 12, fill: "var(--color-ink-soft, #3f4b59)" }}
                tickFormatter={(v: number) => v.toFixed(2)}
                label={{ value: "pu", angle: -90, position: "insideLeft", fill: "var(--color-ink-soft, #3f4b59)" }}
              />
              <Area
                dataKey="band"
                name="allowed band"
                stroke="var(--color-ok, #2e7031)"
                strokeDasharray="4 3"
                fill="var(--color-ok-wash, #e6f0e3)"
                isAnimationActive={false}
              />
              <Line dataKey="vPu" name="voltage" stroke="var(--color-ink, #1d2733)" strokeWidth={2} dot={{ r: 4 }} isAnimationActive={false} />
              <Tooltip
                formatter={(value) =>
                  Array.isArray(value) ? `${fixed(Number(value[0]), 3)}–${fixed(Number(value[1]), 3)} pu` : `${fixed(Number(value), 4)} pu`
                }
              />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
        <figcaption className="ks-panel-note">
          Voltage along the chain (line) against each bus's allowed band (shaded, dashed edges):{" "}
          {rows.map((r) => `${r.name} ${fixed(r.vPu, 3)} pu ${statusCue[r.status].words}`).join("; ")}.
        </figcaption>
      </figure>
    </div>
  );
}
