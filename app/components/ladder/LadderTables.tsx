// The alternatives side by side, and how their order moves with the energy price. Shared by the
// ladder page and the study report, so both say the same thing in the same words.
import type { ReactNode } from "react";
import type { Ladder, LadderAlternative } from "#solver/ladder.ts";
import type { Network } from "#solver/schema.ts";
import { verdictCue, verdictOf, verdictWords } from "./ladderText.ts";
import { checkLine } from "#app/lib/checkText.ts";
import { fixed, kvText, moneyText } from "#app/lib/format.ts";

type Cell = (a: LadderAlternative, index: number) => ReactNode;

interface Row {
  label: ReactNode;
  unit?: string;
  cell: Cell;
  /** Text cells are left-aligned; numbers right-aligned. */
  text?: boolean;
}

interface Group {
  title: ReactNode;
  rows: Row[];
}

const busName = (network: Network, id: string) => network.buses.find((b) => b.id === id)?.name ?? id;

export function VerdictTag({ alternative }: { alternative: Pick<LadderAlternative, "converged" | "withinLimits" | "checks"> }) {
  const cue = verdictCue[verdictOf(alternative)];
  return (
    <span className={`ks-verdict ${cue.className}`}>
      <span aria-hidden="true">{cue.icon}</span> {verdictWords(alternative)}
    </span>
  );
}

export function CheapestTag() {
  return (
    <span className="ks-cheapest-tag">
      <span aria-hidden="true">★</span> Lowest total cost
    </span>
  );
}

export function LadderComparison({ ladder, network, caption }: { ladder: Ladder; network: Network; caption?: ReactNode }) {
  const currency = ladder.money.currency;
  const reference = ladder.inverseSquareReference;
  const ranking = ladder.sensitivity.cases.find((c) => c.priceFactor === 1)?.ranking ?? [];
  const groups: Group[] = [
    {
      title: "Load flow",
      rows: [
        { label: "What it comes to", text: true, cell: (a) => <span className="ks-ladder-sentence">{a.message}</span> },
        { label: "Losses in all", unit: "MW", cell: (a) => fixed(a.lossMW, 3) },
        { label: "Line losses", unit: "MW", cell: (a) => fixed(a.lineLossMW, 3) },
        { label: "of which the re-rated section", unit: "MW", cell: (a) => fixed(a.sectionLineLossMW, 3) },
        {
          label: reference ? `Section by the 1/V² law from ${kvText(reference.voltageKV)}` : "Section by the 1/V² law",
          unit: "MW",
          cell: (a) => fixed(a.predictedSectionLineLossMW, 3),
        },
        { label: "Transformer copper losses", unit: "MW", cell: (a) => fixed(a.transformerCopperLossMW, 3) },
        { label: "Transformer core losses", unit: "MW", cell: (a) => fixed(a.transformerCoreLossMW, 3) },
        { label: "Lowest bus voltage", unit: "pu", cell: (a) => fixed(a.minVPu, 3) },
        { label: "Highest bus voltage", unit: "pu", cell: (a) => fixed(a.maxVPu, 3) },
        {
          label: "Checks broken",
          text: true,
          cell: (a) => {
            const broken = a.checks.filter((c) => c.kind !== "not-converged");
            if (!a.converged) return "–";
            if (broken.length === 0) return "None";
            return (
              <ul className="ks-ladder-checks">
                {broken.map((c, i) => (
                  <li key={`${c.element}-${c.kind}-${i}`}>
                    <span aria-hidden="true">✕ </span>
                    {checkLine(c, a.network)}
                  </li>
                ))}
              </ul>
            );
          },
        },
      ],
    },
    ...sizingGroup(ladder),
    ...ladder.section.endBusIds.map((endId) => {
      const bus = network.buses.find((b) => b.id === endId);
      const at = (a: LadderAlternative) => a.faults.find((f) => f.id === endId);
      return {
        title: (
          <>
            Fault levels at {busName(network, endId)}
            {bus?.breakingKA !== undefined ? <span className="unit"> (switchgear breaks {fixed(bus.breakingKA, 1)} kA)</span> : null}
          </>
        ),
        rows: [
          { label: "Three-phase I″k3", unit: "kA", cell: (a: LadderAlternative) => fixed(at(a)?.ik3kA, 2) },
          { label: "Three-phase S″k3", unit: "MVA", cell: (a: LadderAlternative) => fixed(at(a)?.ik3MVA, 0) },
          { label: "Peak ip", unit: "kA", cell: (a: LadderAlternative) => fixed(at(a)?.ip3kA, 2) },
          { label: "Line to earth I″k1", unit: "kA", cell: (a: LadderAlternative) => fixed(at(a)?.ik1kA, 2) },
        ],
      };
    }),
    {
      title: <>Money <span className="unit">({currency})</span></>,
      rows: [
        { label: "Energy lost in the first year", unit: "MWh", cell: (a) => fixed(a.money.losses?.energyLostFirstYear.totalMWh, 0) },
        { label: "Cost of losses in the first year", cell: (a) => moneyText(a.money.losses?.lossCostFirstYear, currency) },
        { label: "Present value of losses", cell: (a) => moneyText(a.money.losses?.presentValueOfLosses, currency) },
        {
          label: "Capital",
          cell: (a) => (
            <>
              {moneyText(a.money.capital.total, currency)}
              <span className="ks-cell-note">{a.money.capital.entered ? "entered" : capitalBasis(a)}</span>
            </>
          ),
        },
        { label: "Total cost", cell: (a) => <strong>{moneyText(a.money.totalCost, currency)}</strong> },
        {
          label: "Order by total cost",
          cell: (_a, index) => {
            const place = ranking.indexOf(index);
            return place < 0 ? "–" : `${place + 1} of ${ranking.length}`;
          },
        },
      ],
    },
  ];

  const cheapest = ladder.cheapest?.index;
  const colClass = (index: number) => (index === cheapest ? "ks-col-cheapest" : undefined);
  return (
    <div className="ks-table-scroll" tabIndex={0} role="region" aria-label="Alternatives side by side">
      <table className="data-table ks-ladder-table">
        {caption ? <caption>{caption}</caption> : null}
        <thead>
          <tr>
            <th scope="col">Alternative</th>
            {ladder.alternatives.map((a, index) => (
              <th key={a.voltageKV} scope="col" className={["num", colClass(index)].filter(Boolean).join(" ")}>
                <span className="ks-alt-kv">{kvText(a.voltageKV)}</span>
                {a.standard ? null : <span className="ks-cell-note">not an IEC 60038 value</span>}
                <VerdictTag alternative={a} />
                {index === cheapest ? <CheapestTag /> : null}
              </th>
            ))}
          </tr>
        </thead>
        {groups.map((group, g) => (
          <tbody key={g}>
            <tr className="ks-group-row">
              <th scope="colgroup" colSpan={ladder.alternatives.length + 1}>
                {group.title}
              </th>
            </tr>
            {group.rows.map((row, r) => (
              <tr key={r}>
                <th scope="row">
                  {row.label}
                  {row.unit ? <span className="unit">, {row.unit}</span> : null}
                </th>
                {ladder.alternatives.map((a, index) => (
                  <td key={a.voltageKV} className={[row.text ? "ks-text-cell" : "num", colClass(index)].filter(Boolean).join(" ")}>
                    {row.cell(a, index)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        ))}
      </table>
    </div>
  );
}

function capitalBasis(a: LadderAlternative): string {
  const entered = [...a.money.capital.lines, ...a.money.capital.transformers].some((item) => item.basis === "entered");
  if (entered) return "partly entered";
  return a.sizing?.chosen && !a.money.capital.entered ? "from unit costs, line by its sized conductor" : "from unit costs";
}

/** The section's conductor as sizing chose it for each alternative, and why (only when the ladder sized it). */
function sizingGroup(ladder: Ladder): Group[] {
  const sized = ladder.alternatives.find((a) => a.sizing);
  if (!sized?.sizing) return [];
  return [
    {
      title: (
        <>
          Section conductor <span className="unit">(sized from the library for a fault cleared in {fixed(sized.sizing.clearingTimeS, 2)} s)</span>
        </>
      ),
      rows: [
        {
          label: "Conductor",
          text: true,
          cell: (a) => (a.sizing?.chosen ? <strong>{a.sizing.chosen.label}</strong> : a.sizing ? "as drawn (none chosen)" : "–"),
        },
        {
          label: "Library types that pass",
          cell: (a) => (a.sizing && a.sizing.verdicts.length > 0 ? `${a.sizing.verdicts.filter((v) => v.passes).length} of ${a.sizing.verdicts.length}` : "–"),
        },
        { label: "Why this one", text: true, cell: (a) => <span className="ks-ladder-sentence">{a.sizing?.note ?? "–"}</span> },
      ],
    },
  ];
}

export function SensitivityTable({ ladder }: { ladder: Ladder }) {
  const currency = ladder.money.currency;
  const { cases, rankingMoves } = ladder.sensitivity;
  const order = (ranking: number[]) => (ranking.length === 0 ? "none carries the load" : ranking.map((i) => kvText(ladder.alternatives[i].voltageKV)).join(", then "));
  const priceWords = (factor: number) => (factor === 1 ? "as entered" : `${factor < 1 ? "−" : "+"}${Math.round(Math.abs(factor - 1) * 100)} %`);
  return (
    <div>
      <div className="ks-table-scroll" tabIndex={0} role="region" aria-label="Ranking against the energy price">
        <table className="data-table ks-sensitivity-table">
          <caption className="ks-table-caption">Order when the energy price moves</caption>
          <thead>
            <tr>
              <th scope="col">Energy price</th>
              {ladder.alternatives.map((a) => (
                <th key={a.voltageKV} scope="col" className="num">
                  {kvText(a.voltageKV)} total
                </th>
              ))}
              <th scope="col">Order by total cost, lowest first</th>
            </tr>
          </thead>
          <tbody>
            {cases.map((c) => (
              <tr key={c.priceFactor}>
                <th scope="row">
                  {priceWords(c.priceFactor)} <span className="unit">({fixed(c.energyPricePerMWh, 2)} {currency}/MWh)</span>
                </th>
                {c.totalCosts.map((total, i) => (
                  <td key={i} className="num">
                    {moneyText(total, currency)}
                  </td>
                ))}
                <td>{order(c.ranking)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="ks-table-note">
        {rankingMoves
          ? "The order changes within ±30 % of the energy price: the choice depends on the price of losses, so look at it again with your own price forecast."
          : "The order stays the same from 30 % below to 30 % above the energy price."}{" "}
        Alternatives that cannot carry the load have no losses to price and are left out of the order.
      </p>
    </div>
  );
}
