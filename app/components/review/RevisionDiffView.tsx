// A readable difference between two revisions: the network's own fields, then elements added,
// removed and changed, each change as "field: before → after" with units.
import type { FieldChange, RevisionDiff } from "#app/lib/revisionDiff.ts";
import { diffSummary } from "#app/lib/revisionDiff.ts";

function ChangeTable({ changes, caption }: { changes: FieldChange[]; caption: string }) {
  return (
    <table className="mt-1 w-full text-sm">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="text-left text-ink-muted">
          <th scope="col" className="w-2/5 py-1 pr-3 font-semibold">
            Field
          </th>
          <th scope="col" className="py-1 pr-3 font-semibold">
            Before
          </th>
          <th scope="col" className="py-1 font-semibold">
            After
          </th>
        </tr>
      </thead>
      <tbody>
        {changes.map((c) => (
          <tr key={c.field} className="border-t border-paper-rule align-top">
            <th scope="row" className="py-1 pr-3 text-left font-normal">
              {c.label}
              {c.unit ? <span className="text-ink-muted"> ({c.unit})</span> : null}
            </th>
            <td className="py-1 pr-3">
              <del className="no-underline decoration-ink-muted">{c.fromText}</del>
            </td>
            <td className="py-1">
              <ins className="font-semibold no-underline">{c.toText}</ins>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function RevisionDiffView({ diff, from, to }: { diff: RevisionDiff; from: number; to: number }) {
  const nothing = diff.network.length + diff.added.length + diff.removed.length + diff.changed.length === 0;
  return (
    <div className="space-y-5">
      <p className="text-ink-soft" role="status">
        Revision {from} → revision {to}: {diffSummary(diff)}
        {diff.unchanged ? `; ${diff.unchanged} ${diff.unchanged === 1 ? "element" : "elements"} unchanged` : ""}.
      </p>
      {nothing ? null : (
        <>
          {diff.network.length ? (
            <section aria-labelledby="diff-network">
              <h3 id="diff-network" className="text-base font-semibold">
                Network
              </h3>
              <ChangeTable changes={diff.network} caption="Changes to the network's own fields" />
            </section>
          ) : null}
          {diff.added.length ? (
            <section aria-labelledby="diff-added">
              <h3 id="diff-added" className="text-base font-semibold">
                <span aria-hidden="true">+ </span>Added
              </h3>
              <ul className="mt-1 list-disc pl-5 text-sm">
                {diff.added.map((e) => (
                  <li key={e.id}>
                    {e.kind} <strong>{e.name}</strong> <span className="text-ink-muted">({e.id})</span>
                  </li>
                ))}
              </ul>
            </section>
          ) : null}
          {diff.removed.length ? (
            <section aria-labelledby="diff-removed">
              <h3 id="diff-removed" className="text-base font-semibold">
                <span aria-hidden="true">− </span>Removed
              </h3>
              <ul className="mt-1 list-disc pl-5 text-sm">
                {diff.removed.map((e) => (
                  <li key={e.id}>
                    {e.kind} <strong>{e.name}</strong> <span className="text-ink-muted">({e.id})</span>
                  </li>
                ))}
              </ul>
            </section>
          ) : null}
          {diff.changed.length ? (
            <section aria-labelledby="diff-changed" className="space-y-4">
              <h3 id="diff-changed" className="text-base font-semibold">
                <span aria-hidden="true">~ </span>Changed
              </h3>
              {diff.changed.map((e) => (
                <div key={e.id}>
                  <h4 className="text-sm font-semibold">
                    {e.kind} {e.name} <span className="font-normal text-ink-muted">({e.id})</span>
                  </h4>
                  <ChangeTable changes={e.changes} caption={`Changes to ${e.kind.toLowerCase()} ${e.name}`} />
                </div>
              ))}
            </section>
          ) : null}
        </>
      )}
    </div>
  );
}
