// The preview of an uploaded network file: what it holds and at which voltages.
import { elementCountLabels, type NetworkFilePreview } from "#app/lib/imports/networkFile.ts";

export function NetworkFileSummary({ preview }: { preview: NetworkFilePreview }) {
  const counts = Object.entries(preview.counts) as [keyof typeof elementCountLabels, number][];
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-1 sm:grid-cols-4">
      <div className="col-span-2 sm:col-span-4">
        <dt className="field-label">Name</dt>
        <dd>{preview.name ?? "(no readable name)"}</dd>
      </div>
      <div className="col-span-2 sm:col-span-4">
        <dt className="field-label">Voltage levels</dt>
        <dd>{preview.voltageLevelsKV.length > 0 ? preview.voltageLevelsKV.map((kV) => `${kV} kV`).join(", ") : "none found"}</dd>
      </div>
      {counts.map(([kind, count]) => (
        <div key={kind}>
          <dt className="text-sm text-ink-muted">{elementCountLabels[kind]}</dt>
          <dd className="num font-medium">{count}</dd>
        </div>
      ))}
    </dl>
  );
}
