// Total cost of each alternative as capital with the present value of its losses stacked on
// top: what a planner decides on. The recommended alternative is named under its bar in words.
import { Bar, BarChart, CartesianGrid, Label, LabelList, XAxis, YAxis } from "recharts";
import type { Ladder } from "#solver/ladder.ts";
import { axisLabel, axisTick, gridStroke, Sized } from "./chartParts.tsx";
import { kvText, millionsText, moneyText } from "#app/lib/format.ts";

const CAPITAL_COLOUR = "#5f7f94";
const LOSSES_COLOUR = "#c9a04e";

export function CostPlot({ ladder, width, height = 260 }: { ladder: Ladder; width?: number; height?: number }) {
  const currency = ladder.money.currency;
  const rows = ladder.alternatives.map((a, index) => ({
    name: kvText(a.voltageKV),
    tag: ladder.cheapest?.index === index ? "★ lowest total" : !a.converged ? "✕ cannot carry" : "",
    capital: a.money.capital.total,
    losses: a.money.losses?.presentValueOfLosses ?? 0,
    total: a.money.totalCost === null ? "capital only" : millionsText(a.money.totalCost),
  }));
  return (
    <figure className="ks-plot">
      <figcaption className="ks-plot-title">Total cost: capital and present value of losses ({currency})</figcaption>
      <Sized width={width} height={height}>
        <BarChart data={rows} margin={{ top: 22, right: 20, bottom: 8, left: 8 }} barCategoryGap="28%">
          <CartesianGrid stroke={gridStroke} vertical={false} />
          <XAxis dataKey="name" tick={TaggedTick(rows)} interval={0} height={40} />
          <YAxis tick={axisTick} tickFormatter={(v: number) => millionsText(v)} width={60}>
            <Label value={currency} angle={-90} position="insideLeft" style={axisLabel} />
          </YAxis>
          <Bar dataKey="capital" name="Capital" stackId="cost" fill={CAPITAL_COLOUR} isAnimationActive={false} />
          <Bar dataKey="losses" name="Present value of losses" stackId="cost" fill={LOSSES_COLOUR} isAnimationActive={false}>
            <LabelList dataKey="total" position="top" style={{ fontSize: 12, fill: "var(--color-ink, #1d2733)", fontWeight: 600 }} />
          </Bar>
        </BarChart>
      </Sized>
      <ul className="ks-plot-legend">
        <li>
          <svg width="14" height="12" aria-hidden="true">
            <rect width="14" height="12" fill={CAPITAL_COLOUR} />
          </svg>{" "}
          Capital
        </li>
        <li>
          <svg width="14" height="12" aria-hidden="true">
            <rect width="14" height="12" fill={LOSSES_COLOUR} />
          </svg>{" "}
          Present value of losses
        </li>
      </ul>
      <p className="ks-plot-note">
        {ladder.alternatives
          .map((a) =>
            a.money.totalCost === null
              ? `${kvText(a.voltageKV)}: capital ${moneyText(a.money.capital.total, currency)}, no losses to price (cannot carry the load)`
              : `${kvText(a.voltageKV)}: ${moneyText(a.money.capital.total, currency)} capital + ${moneyText(a.money.losses!.presentValueOfLosses, currency)} losses = ${moneyText(a.money.totalCost, currency)}`,
          )
          .join("; ")}
        .
      </p>
    </figure>
  );
}

/** The category's voltage with its verdict in words under it. */
function TaggedTick(rows: { name: string; tag: string }[]) {
  return function Tick({ x: xAt, y: yAt, payload }: { x: number | string; y: number | string; payload: { value?: unknown } }) {
    const x = Number(xAt);
    const y = Number(yAt);
    const row = rows.find((r) => r.name === payload?.value);
    return (
      <text x={x} y={y + 12} textAnchor="middle" fontSize={12} fill="var(--color-ink, #1d2733)">
        <tspan x={x} fontWeight={600}>
          {String(payload?.value ?? "")}
        </tspan>
        {row?.tag ? (
          <tspan x={x} dy={14} fontSize={11} fill="var(--color-ink-soft, #3f4b59)">
            {row.tag}
          </tspan>
        ) : null}
      </text>
    );
  };
}
