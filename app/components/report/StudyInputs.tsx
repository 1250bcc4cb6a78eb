// What each alternative of the saved study was asked to change beyond its voltage, as the
// report prints it: conductor (entered, or chosen by the ladder's sizing), taps and capital
// entries, or "as drawn".
import { fixed, kvText, moneyText } from "#app/lib/format.ts";
import type { AlternativeOverrides, Ladder } from "#solver/ladder.ts";
import type { Network } from "#solver/schema.ts";
import { REPORT_TABLE, TableScroll } from "./TableScroll.tsx";

export function StudyInputs({
  ladder,
  network,
  overrides,
}: {
  ladder: Ladder;
  network: Network;
  overrides: readonly (AlternativeOverrides | null)[] | undefined;
}) {
  const currency = ladder.money.currency;
  const tName = (id: string) => network.transformers.find((t) => t.id === id)?.name ?? id;
  return (
    <TableScroll label="Inputs of each alternative">
      <table className={REPORT_TABLE}>
        <caption>Inputs of each alternative</caption>
        <thead>
          <tr>
            <th scope="col">Alternative</th>
            <th scope="col">Conductor of the section</th>
            <th scope="col">Taps</th>
            <th scope="col">Capital</th>
          </tr>
        </thead>
        <tbody>
          {ladder.alternatives.map((a, i) => {
            const o = overrides?.[i] ?? {};
            const taps = Object.entries(o.transformers ?? {}).filter(([, t]) => t.tapPct !== undefined);
            return (
              <tr key={a.voltageKV}>
                <th scope="row">{kvText(a.voltageKV)}</th>
                <td>
                  {o.conductor
                    ? `${o.conductor.name ?? "entered"}: ${fixed(o.conductor.rOhmPerKm, 4)} + j${fixed(o.conductor.xOhmPerKm, 4)} Ω/km${o.conductor.ampacityA ? `, ${o.conductor.ampacityA} A` : ""}`
                    : a.sizing?.chosen
                      ? `${a.sizing.chosen.label}, sized from the library for a fault cleared in ${a.sizing.clearingTimeS} s`
                      : a.sizing
                        ? "as drawn (no library type passes)"
                        : "as drawn"}
                </td>
                <td>{taps.length === 0 ? "as drawn" : taps.map(([id, t]) => `${tName(id)} ${t.tapPct! > 0 ? "+" : ""}${t.tapPct} %`).join("; ")}</td>
                <td>
                  {a.money.capital.entered
                    ? `${moneyText(a.money.capital.total, currency)} entered`
                    : o.capital?.lineCostPerKm !== undefined
                      ? `lines at ${moneyText(o.capital.lineCostPerKm, currency)} per km entered; transformers from unit costs`
                      : a.sizing?.chosen
                        ? "from unit costs, line by its sized conductor"
                        : "from unit costs"}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </TableScroll>
  );
}
