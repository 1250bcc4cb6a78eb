// The voltage profile along the chain, from the slack source to a chosen end bus, with each
// bus's allowed band drawn behind the line: the ladder's profile chart with the present network
// as its one line. Loaded on demand: the chart library is large.
import { useId, useMemo, useState } from "react";
import type { Network } from "#solver/schema.ts";
import { chainEnds, chainTo } from "#solver/topology.ts";
import { readingNumber } from "#app/lib/format.ts";
import { statusCue, voltageStatus } from "#app/lib/limitStatus.ts";
import { styleOfAlternative } from "#app/components/ladder/chartParts.tsx";
import { profileRows, VoltageProfileChart, type ProfileSeries } from "#app/components/ladder/VoltageProfileChart.tsx";
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
  const series = useMemo<ProfileSeries[]>(
    () => [{ label: "voltage", vPuByBus: new Map([...readings.buses].map(([id, r]) => [id, r.vPu])), style: styleOfAlternative(0) }],
    [readings],
  );
  const rows = useMemo(
    () => (endBus ? profileRows(document, chainTo(document, endBus), series).filter((r) => Number.isFinite(r.v0 as number)) : []),
    [document, series, endBus],
  );

  if (!rows.length) return <p className="ks-panel-note">There is no chain from a slack source to draw yet.</p>;
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
        <VoltageProfileChart rows={rows} series={series} height={220} />
        <figcaption className="ks-panel-note">
          Voltage along the chain (line) against each bus's allowed band (shaded, dashed edges):{" "}
          {rows
            .map((r) => {
              const vPu = r.v0 as number;
              return `${r.name} ${readingNumber(vPu, "pu")} pu ${statusCue[voltageStatus(vPu, r.band[0], r.band[1])].words}`;
            })
            .join("; ")}
          .
        </figcaption>
      </figure>
    </div>
  );
}
