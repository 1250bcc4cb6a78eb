// On the networks page: networks someone opened a share link to, outside their own teams. Each
// stays here while its link lives.
import { Link } from "react-router";
import { formatDateTime } from "#app/lib/format.ts";

export interface SharedNetworkItem {
  id: number;
  name: string;
  role: "viewer" | "editor";
  revision: number;
  updatedAt: string;
}

export function SharedWithYou({ networks }: { networks: SharedNetworkItem[] }) {
  return (
    <section aria-labelledby="shared-with-you-title" className="panel mt-6 p-5">
      <h2 id="shared-with-you-title" className="text-lg">
        Shared with you
      </h2>
      <p className="mt-1 text-sm text-ink-muted">Opened through share links; each stays here until its link is revoked or expires.</p>
      <ul className="mt-3 divide-y divide-paper-rule">
        {networks.map((n) => (
          <li key={n.id} className="flex flex-wrap items-baseline justify-between gap-3 py-2">
            <Link to={`/networks/${n.id}`}>{n.name}</Link>
            <span className="text-sm text-ink-muted">
              <span className="role-badge">{n.role}</span> · revision {n.revision}, {formatDateTime(n.updatedAt)}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
