// The account page's API tokens: create one (its text is shown once), see when each was last
// used, revoke any at once. Scripts send a token as `Authorization: Bearer …`.
import { useFetcher } from "react-router";
import { formatDateTime } from "#app/lib/format.ts";
import { Notice } from "./Notice.tsx";

export interface ApiTokenRow {
  id: number;
  name: string;
  scope: "read" | "write";
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

type ActionResult =
  | { intent: "create"; ok: true; token: string; name: string; scope: "read" | "write" }
  | { intent: "create"; ok: false; fieldErrors: Record<string, string> }
  | { intent: "revoke"; ok: boolean; message: string };

export function ApiTokensPanel({ tokens }: { tokens: ApiTokenRow[] }) {
  const create = useFetcher<ActionResult>();
  const revoke = useFetcher<ActionResult>();
  const created = create.data?.intent === "create" && create.data.ok ? create.data : undefined;
  const errors = create.data?.intent === "create" && !create.data.ok ? create.data.fieldErrors : {};
  const revoked = revoke.data?.intent === "revoke" ? revoke.data : undefined;
  return (
    <section aria-labelledby="api-tokens" className="panel mt-6 p-6">
      <h2 id="api-tokens" className="text-lg">
        API tokens
      </h2>
      <p className="mt-1 text-ink-soft">
        For scripts calling the <a href="/docs/api">HTTP API</a>: send <code>Authorization: Bearer &lt;token&gt;</code>. A token acts with your
        roles; a read token can only read and solve, a write token can also change what your roles allow.
      </p>
      {created ? (
        <div className="mt-4">
          <Notice tone="ok">
            Token "{created.name}" ({created.scope}) created. Copy it now: it is shown only this once.
            <code className="mt-2 block break-all rounded bg-paper p-2 select-all" aria-label="The new token">
              {created.token}
            </code>
          </Notice>
        </div>
      ) : null}
      {revoked ? (
        <div className="mt-4">
          <Notice tone={revoked.ok ? "ok" : "error"}>{revoked.message}</Notice>
        </div>
      ) : null}
      <create.Form method="post" action="/account/tokens" className="mt-4 flex flex-wrap items-end gap-3">
        <input type="hidden" name="intent" value="create" />
        <div>
          <label htmlFor="token-name" className="field-label">
            Token name
          </label>
          <input id="token-name" name="name" className="input" maxLength={100} required aria-invalid={errors.name ? true : undefined} />
          {errors.name ? <p className="field-error">{errors.name}</p> : null}
        </div>
        <div>
          <label htmlFor="token-scope" className="field-label">
            Scope
          </label>
          <select id="token-scope" name="scope" className="input" defaultValue="read">
            <option value="read">read</option>
            <option value="write">write</option>
          </select>
          {errors.scope ? <p className="field-error">{errors.scope}</p> : null}
        </div>
        <button type="submit" className="btn btn-primary" disabled={create.state !== "idle"}>
          Create token
        </button>
      </create.Form>
      {tokens.length > 0 ? (
        <div className="relative mt-4 overflow-x-auto">
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">Scope</th>
                <th scope="col">Created</th>
                <th scope="col">Last used</th>
                <th scope="col">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {tokens.map((token) => (
                <tr key={token.id}>
                  <td>{token.name}</td>
                  <td>{token.scope}</td>
                  <td className="whitespace-nowrap">{formatDateTime(token.createdAt)}</td>
                  <td className="whitespace-nowrap">{token.lastUsedAt ? formatDateTime(token.lastUsedAt) : "never"}</td>
                  <td>
                    {token.revokedAt ? (
                      <span className="text-ink-muted">revoked {formatDateTime(token.revokedAt)}</span>
                    ) : (
                      <revoke.Form method="post" action="/account/tokens">
                        <input type="hidden" name="intent" value="revoke" />
                        <input type="hidden" name="tokenId" value={token.id} />
                        <input type="hidden" name="tokenName" value={token.name} />
                        <button type="submit" className="btn btn-small btn-danger" aria-label={`Revoke ${token.name}`}>
                          Revoke
                        </button>
                      </revoke.Form>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="mt-4 text-ink-muted">No tokens yet.</p>
      )}
    </section>
  );
}
