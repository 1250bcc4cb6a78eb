// On the team page, for owners: the audit log, newest first. Each line is the sentence written
// when it happened, with its time.
import { formatDateTime } from "#app/lib/format.ts";

export interface AuditEventItem {
  id: number;
  kind: string;
  summary: string;
  createdAt: string;
}

const KIND_WORDS: Record<string, string> = {
  "share-created": "Share",
  "share-revoked": "Share",
  "link-used": "Link used",
  "member-invited": "Members",
  "member-joined": "Members",
  "member-added": "Members",
  "role-changed": "Roles",
  "member-removed": "Members",
  "network-deleted": "Networks",
  "network-restored": "Networks",
  "revision-restored": "Revisions",
};

export function TeamAuditLog({ events }: { events: AuditEventItem[] }) {
  return (
    <section aria-labelledby="audit-title" className="panel mt-6 p-5">
      <h2 id="audit-title" className="text-lg">
        Audit log
      </h2>
      <p className="mt-1 text-sm text-ink-muted">Shares and their use, members and roles, deleted and restored networks. Only owners see this.</p>
      {events.length === 0 ? (
        <p className="mt-3 text-ink-soft">Nothing recorded yet.</p>
      ) : (
        <div className="mt-3 max-h-[28rem] overflow-y-auto" tabIndex={0} role="region" aria-label="Audit log entries, scrollable">
          <table className="w-full text-sm">
            <caption className="sr-only">Audit log, newest first</caption>
            <thead>
              <tr className="text-left text-ink-muted">
                <th scope="col" className="py-1 pr-3 font-semibold">
                  When
                </th>
                <th scope="col" className="py-1 pr-3 font-semibold">
                  About
                </th>
                <th scope="col" className="py-1 font-semibold">
                  What happened
                </th>
              </tr>
            </thead>
            <tbody>
              {events.map((e) => (
                <tr key={e.id} className="border-t border-paper-rule align-top">
                  <td className="whitespace-nowrap py-1.5 pr-3">{formatDateTime(e.createdAt)}</td>
                  <td className="py-1.5 pr-3">{KIND_WORDS[e.kind] ?? e.kind}</td>
                  <td className="py-1.5">{e.summary}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
