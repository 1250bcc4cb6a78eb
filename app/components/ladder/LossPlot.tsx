// Losses against the section's voltage, with Joule's 1/V² law drawn through the lowest voltage
// that carries the load: the law beside the computed numbers, so a planner sees where the chain
// follows it and where voltage drop, transformers and the rest of the chain part from it.
import { CartesianGrid, ComposedChart, Label, Line, ReferenceLine, Scatter, XAxis, YAxis } from "recharts";
import type { Ladder } from "#solver/ladder.ts";
import { axisLabel, axisTick, gridStroke, Marker, Sized, type AlternativeStyle } from "./chartParts.tsx";
import { fixed, kvText } from "#app/lib/format.ts";

const SECTION_STYLE: AlternativeStyle = { colour: "#1f5f7a", marker: "circle" };
const ALL_STYLE: AlternativeStyle = { colour: "#9a6a12", marker: "square" };
const LAW_COLOUR = "var(--color-ink-muted, #5a6573)";
const CURVE_POINTS = 48;

export function LossPlot({ ladder, width, height = 260 }: { ladder: Ladder; width?: number; height?: number }) {
  const alternatives = ladder.alternatives;
  const carried = alternatives.filter((a) => a.sectionLineLossMW !== null);
  const voltages = alternatives.map((a) => a.voltageKV);
  const lowKV = Math.min(...voltages);
  const highKV = Math.max(...voltages);
  const span = Math.max(highKV - lowKV, lowKV * 0.5);
  const domain: [number, number] = [Math.max(0, lowKV - span * 0.12), highKV + span * 0.08];
  const reference = ladder.inverseSquareReference;
  const curve = reference
    ? Array.from({ length: CURVE_POINTS }, (_, k) => {
        const voltageKV = Math.max(reference.voltageKV * 0.75, domain[0]) + ((domain[1] - Math.max(reference.voltageKV * 0.75, domain[0])) * k) / (CURVE_POINTS - 1);
        return { voltageKV, lawMW: reference.sectionLineLossMW * (reference.voltageKV / voltageKV) ** 2 };
      })
    : [];
  const sectionPoints = carried.map((a) => ({ voltageKV: a.voltageKV, sectionMW: a.sectionLineLossMW! }));
  const allPoints = carried.map((a) => ({ voltageKV: a.voltageKV, allMW: a.lossMW! }));
  const top = Math.max(0.001, ...allPoints.map((p) => p.allMW), ...sectionPoints.map((p) => p.sectionMW));
  const notCarried = alternatives.filter((a) => !a.converged);

  return (
    <figure className="ks-plot">
      <figcaption className="ks-plot-title">Losses against voltage</figcaption>
      <Sized width={width} height={height}>
        <ComposedChart margin={{ top: 12, right: 20, bottom: 22, left: 8 }}>
          <CartesianGrid stroke={gridStroke} />
          <XAxis
            type="number"
            dataKey="voltageKV"
            domain={domain}
            ticks={voltages}
            tick={axisTick}
            tickFormatter={(kv: number) => kvText(kv)}
            allowDuplicatedCategory={false}
          >
            <Label value="Section voltage" position="insideBottom" offset={-14} style={axisLabel} />
          </XAxis>
          <YAxis type="number" domain={[0, Number((top * 1.15).toPrecision(2))]} tick={axisTick} tickFormatter={(mw: number) => fixed(mw, 2)} width={52}>
            <Label value="MW" angle={-90} position="insideLeft" style={axisLabel} />
          </YAxis>
          {notCarried.map((a) => (
            <ReferenceLine key={a.voltageKV} x={a.voltageKV} stroke="var(--color-over, #b02a1f)" strokeDasharray="3 3">
              <Label value={`✕ ${kvText(a.voltageKV)}: cannot carry the load`} position="insideTopLeft" style={{ ...axisLabel, fill: "var(--color-over, #b02a1f)" }} />
            </ReferenceLine>
          ))}
          {reference ? (
            <Line data={curve} dataKey="lawMW" name="1/V² law" stroke={LAW_COLOUR} strokeDasharray="6 4" strokeWidth={1.5} dot={false} isAnimationActive={false} />
          ) : null}
          <Scatter data={allPoints} dataKey="allMW" name="All losses" isAnimationActive={false} shape={(p: { cx?: number; cy?: number }) => <Marker cx={p.cx} cy={p.cy} style={ALL_STYLE} />} />
          <Scatter
            data={sectionPoints}
            dataKey="sectionMW"
            name="Section line losses"
            isAnimationActive={false}
            shape={(p: { cx?: number; cy?: number }) => <Marker cx={p.cx} cy={p.cy} style={SECTION_STYLE} />}
          />
        </ComposedChart>
      </Sized>
      <ul className="ks-plot-legend">
        <li>
          <LegendMark style={SECTION_STYLE} line={false} /> Line losses of the re-rated section (computed)
        </li>
        {reference ? (
          <li>
            <svg width="28" height="10" aria-hidden="true">
              <line x1="0" y1="5" x2="28" y2="5" stroke={LAW_COLOUR} strokeWidth="1.5" strokeDasharray="6 4" />
            </svg>{" "}
            1/V² law through {kvText(reference.voltageKV)} ({fixed(reference.sectionLineLossMW, 3)} MW)
          </li>
        ) : null}
        <li>
          <LegendMark style={ALL_STYLE} line={false} /> All losses of the network (computed)
        </li>
      </ul>
      <p className="ks-plot-note">
        {reference
          ? carried
              .map(
                (a) =>
                  `${kvText(a.voltageKV)}: section ${fixed(a.sectionLineLossMW, 3)} MW against ${fixed(a.predictedSectionLineLossMW, 3)} MW by the law, all losses ${fixed(a.lossMW, 3)} MW`,
              )
              .join("; ") + "."
          : "No alternative carries the load, so there are no losses to compare."}
        {notCarried.length > 0 ? ` ${notCarried.map((a) => kvText(a.voltageKV)).join(", ")} cannot carry the load and has no losses to plot.` : ""}
      </p>
    </figure>
  );
}

/** A legend entry's sample: the marker, on its line when the series is drawn as one. */
export function LegendMark({ style, line = true }: { style: AlternativeStyle; line?: boolean }) {
  return (
    <svg width="28" height="12" aria-hidden="true">
      {line ? <line x1="0" y1="6" x2="28" y2="6" stroke={style.colour} strokeWidth="2" strokeDasharray={style.dash} /> : null}
      <Marker cx={14} cy={6} style={style} size={3.5} />
    </svg>
  );
}
