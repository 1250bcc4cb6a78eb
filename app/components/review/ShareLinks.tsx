// The Share page's parts: the new link shown once with a copy button, and the list of links with
// their state, who used them and when, and a revoke button.
import { useState } from "react";
import { Form } from "react-router";
import { formatDateTime } from "#app/lib/format.ts";

export interface ShareLinkItem {
  id: number;
  role: "viewer" | "editor";
  label: string;
  createdAt: string;
  createdByName: string | null;
  expiresAt: string | null;
  revokedAt: string | null;
  state: "live" | "expired" | "revoked";
  uses: { userName: string | null; userEmail: string | null; usedAt: string }[];
}

export function CopyLink({ url, label }: { url: string; label: string }) {
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  return (
    <div>
      <label htmlFor="new-share-url" className="field-label">
        {label}
      </label>
      <div className="flex flex-wrap gap-2">
        <input id="new-share-url" className="input min-w-0 flex-1 font-mono text-sm" readOnly value={url} onFocus={(e) => e.currentTarget.select()} />
        <button
          type="button"
          className="btn btn-primary"
          onClick={() => {
            navigator.clipboard
              .writeText(url)
              .then(() => setCopied("yes"))
              .catch(() => setCopied("failed"));
          }}
        >
          Copy link
        </button>
      </div>
      <p className="field-hint" role="status">
        {copied === "yes"
          ? "Copied."
          : copied === "failed"
            ? "This browser would not copy it; select the address and copy it by hand."
            : "Copy it now: for safety Kilostep keeps only a fingerprint of it and cannot show it again."}
      </p>
    </div>
  );
}

const STATE_WORDS: Record<ShareLinkItem["state"], string> = { live: "Works", expired: "Expired", revoked: "Revoked" };

export function ShareLinkList({ links }: { links: ShareLinkItem[] }) {
  if (links.length === 0) return <p className="text-ink-soft">No share links yet.</p>;
  return (
    <ul className="divide-y divide-paper-rule">
      {links.map((link) => (
        <li key={link.id} className="py-4" aria-labelledby={`share-link-${link.id}`}>
          <div className="flex flex-wrap items-baseline justify-between gap-3">
            <h3 id={`share-link-${link.id}`} className="text-base font-semibold">
              Link #{link.id} · {link.role === "editor" ? "edit" : "view"}
              {link.label ? ` · ${link.label}` : ""}
            </h3>
            <span className={`text-sm font-semibold ${link.state === "live" ? "text-ok" : "text-ink-muted"}`}>
              <span aria-hidden="true">{link.state === "live" ? "● " : "○ "}</span>
              {STATE_WORDS[link.state]}
            </span>
          </div>
          <p className="mt-1 text-sm text-ink-muted">
            Made {formatDateTime(link.createdAt)}
            {link.createdByName ? ` by ${link.createdByName}` : ""} ·{" "}
            {link.revokedAt
              ? `revoked ${formatDateTime(link.revokedAt)}`
              : link.expiresAt
                ? `${link.state === "expired" ? "expired" : "works until"} ${formatDateTime(link.expiresAt)}`
                : "no expiry"}
          </p>
          {link.uses.length > 0 ? (
            <details className="mt-2">
              <summary className="cursor-pointer text-sm">
                Used {link.uses.length} {link.uses.length === 1 ? "time" : "times"}, last {formatDateTime(link.uses[0].usedAt)}
              </summary>
              <table className="mt-2 text-sm">
                <caption className="sr-only">Uses of link #{link.id}</caption>
                <thead>
                  <tr>
                    <th scope="col" className="pr-6 text-left font-semibold">
                      Who
                    </th>
                    <th scope="col" className="text-left font-semibold">
                      When
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {link.uses.map((use, i) => (
                    <tr key={`${use.usedAt}-${i}`}>
                      <td className="pr-6">{use.userName ? `${use.userName} (${use.userEmail})` : "Someone without an account"}</td>
                      <td>{formatDateTime(use.usedAt)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </details>
          ) : (
            <p className="mt-2 text-sm text-ink-soft">Not used yet.</p>
          )}
          {link.state === "live" ? (
            <Form method="post" className="mt-2">
              <input type="hidden" name="intent" value="revoke" />
              <input type="hidden" name="linkId" value={link.id} />
              <button type="submit" className="btn btn-danger btn-small">
                Revoke link #{link.id}
              </button>
            </Form>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
