import { Form, Link } from "react-router";
import { formatDate, formatDateTime } from "#app/lib/format.ts";
import { NETWORK_NAME_MAX } from "#app/lib/fieldSchemas.ts";

export interface NetworkRow {
  id: number;
  name: string;
  teamId: number;
  teamName: string;
  role: string;
  revision: number;
  updatedAt: string;
  updatedByName: string | null;
  may: { rename: boolean; delete: boolean };
}

export interface DeletedNetworkRow {
  id: number;
  name: string;
  teamName: string;
  deletedAt: string;
  deletedByName: string | null;
  restorableUntil: string;
}

/** The networks table; rename and delete appear only where the caller's role allows them. */
export function NetworkRows({ networks }: { networks: NetworkRow[] }) {
  if (networks.length === 0) {
    return (
      <p className="p-6 text-ink-soft">
        No networks yet. Start one from a blank sheet or a demo study; it will be listed here.
      </p>
    );
  }
  const anyActions = networks.some((n) => n.may.rename || n.may.delete);
  return (
    <table className="data-table">
      <thead>
        <tr>
          <th scope="col">Name</th>
          <th scope="col">Team</th>
          <th scope="col" className="num">
            Revision
          </th>
          <th scope="col">Updated</th>
          {anyActions ? (
            <th scope="col">
              <span className="sr-only">Actions</span>
            </th>
          ) : null}
        </tr>
      </thead>
      <tbody>
        {networks.map((n) => (
          <tr key={n.id}>
            <td className="min-w-48">
              <Link to={`/networks/${n.id}`} className="font-medium">
                {n.name}
              </Link>
            </td>
            <td>
              <Link to={`/teams/${n.teamId}`} className="text-ink-soft">
                {n.teamName}
              </Link>
              <span className="sr-only">, your role {n.role}</span>
            </td>
            <td className="num">{n.revision}</td>
            <td className="whitespace-nowrap">
              <span className="block">{formatDateTime(n.updatedAt)}</span>
              {n.updatedByName ? <span className="block text-sm text-ink-muted">by {n.updatedByName}</span> : null}
            </td>
            {anyActions ? (
              <td>
                <div className="flex flex-wrap items-start justify-end gap-2">
                  {n.may.rename ? <RenameControl key={`${n.id}-${n.revision}`} network={n} /> : null}
                  {n.may.delete ? (
                    <Form method="post">
                      <input type="hidden" name="intent" value="delete" />
                      <input type="hidden" name="networkId" value={n.id} />
                      <button type="submit" className="btn btn-small btn-danger" aria-label={`Delete ${n.name}`}>
                        Delete
                      </button>
                    </Form>
                  ) : null}
                </div>
              </td>
            ) : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Rename in place: a disclosure holding a one-field form, reachable and closable by keyboard. */
function RenameControl({ network }: { network: NetworkRow }) {
  const inputId = `rename-${network.id}`;
  return (
    <details className="group">
      <summary
        className="btn btn-small list-none [&::-webkit-details-marker]:hidden"
        aria-label={`Rename ${network.name}`}
      >
        Rename
      </summary>
      <Form method="post" className="mt-2 flex w-64 flex-col gap-2 rounded border border-paper-edge bg-paper-sheet p-3">
        <input type="hidden" name="intent" value="rename" />
        <input type="hidden" name="networkId" value={network.id} />
        <label htmlFor={inputId} className="field-label">
          New name for {network.name}
        </label>
        <input id={inputId} name="name" defaultValue={network.name} required maxLength={NETWORK_NAME_MAX} className="input" />
        <button type="submit" className="btn btn-small btn-primary">
          Save name
        </button>
      </Form>
    </details>
  );
}

export function RecentlyDeleted({ networks }: { networks: DeletedNetworkRow[] }) {
  return (
    <section aria-labelledby="recently-deleted-title" className="mt-10">
      <h2 id="recently-deleted-title" className="text-xl">
        Recently deleted
      </h2>
      <p className="mt-1 text-ink-soft">Deleted networks stay restorable for 30 days, then they are gone for good.</p>
      <div className="relative panel mt-4 overflow-x-auto" role="region" aria-label="Recently deleted networks" tabIndex={0}>
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">Team</th>
              <th scope="col">Deleted</th>
              <th scope="col">Restorable until</th>
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {networks.map((n) => (
              <tr key={n.id}>
                <td className="font-medium">{n.name}</td>
                <td>{n.teamName}</td>
                <td>
                  {formatDateTime(n.deletedAt)}
                  {n.deletedByName ? <span className="block text-sm text-ink-muted">by {n.deletedByName}</span> : null}
                </td>
                <td>{formatDate(n.restorableUntil)}</td>
                <td className="text-right">
                  <Form method="post">
                    <input type="hidden" name="intent" value="restore" />
                    <input type="hidden" name="networkId" value={n.id} />
                    <label className="mr-3 inline-flex items-center gap-1 text-sm">
                      <input type="checkbox" name="reviveLinks" aria-label={`Open the share links of ${n.name} again`} />
                      open its share links again
                    </label>
                    <button type="submit" className="btn btn-small" aria-label={`Restore ${n.name}`}>
                      Restore
                    </button>
                  </Form>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
