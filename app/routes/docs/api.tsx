import { Link } from "react-router";
import type { Route } from "./+types/api";
import { PageTitle } from "#app/components/PageTitle.tsx";
import { API_ENDPOINTS, curlCommand, EXAMPLE_VARIABLES } from "#app/lib/apiDocs.ts";

export const meta: Route.MetaFunction = () => [{ title: "HTTP API · Kilostep" }];

export default function ApiDocs() {
  return (
    <>
      <PageTitle
        title="HTTP API"
        lead="Everything a script needs to read, change and solve networks. JSON in and out; the same role checks as the pages."
      />
      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="space-y-6">
          {API_ENDPOINTS.map((endpoint) => (
            <section
              key={`${endpoint.method} ${endpoint.route}`}
              aria-labelledby={`${endpoint.method}-${endpoint.route}`}
              className="panel p-5"
            >
              <h2 id={`${endpoint.method}-${endpoint.route}`} className="font-mono text-base break-words">
                <span className="role-badge mr-2">{endpoint.method}</span>
                {endpoint.route}
              </h2>
              <p className="mt-2">{endpoint.what}</p>
              <p className="mt-1 text-sm text-ink-muted">Who may: {endpoint.who}.</p>
              {endpoint.example.note ? <p className="mt-1 text-sm text-ink-soft">{endpoint.example.note}.</p> : null}
              <pre className="mt-3 overflow-x-auto rounded border border-paper-rule bg-paper p-3 text-sm" tabIndex={0}>
                <code>{curlCommand(endpoint)}</code>
              </pre>
            </section>
          ))}
        </div>
        <aside className="panel space-y-4 p-5 text-sm" aria-labelledby="api-basics">
          <h2 id="api-basics" className="text-lg">
            Basics
          </h2>
          <div>
            <h3 className="font-medium">Tokens</h3>
            <p>
              Create a token on your <Link to="/account">account page</Link> and send it as{" "}
              <code>Authorization: Bearer &lt;token&gt;</code>. It acts with your roles. A <em>read</em> token may read and solve;
              a <em>write</em> token may also change whatever your roles allow. Revoke a token there at any time.
            </p>
          </div>
          <div>
            <h3 className="font-medium">The examples' variables</h3>
            <dl>
              {EXAMPLE_VARIABLES.map((v) => (
                <div key={v.name} className="mt-1">
                  <dt>
                    <code>${v.name}</code>
                  </dt>
                  <dd className="text-ink-soft">{v.meaning}</dd>
                </div>
              ))}
            </dl>
            <p className="mt-2">
              <code>network.json</code> is a network file, such as one exported from a network's page.
            </p>
          </div>
          <div>
            <h3 className="font-medium">Errors</h3>
            <p>
              A 4xx status with <code>{'{ "error": "sentence", "issues": [{ "path", "message" }] }'}</code>: 400 for a body that is
              not right (each problem with its path), 401 without a valid token, 403 when your role or the token's scope does not
              allow it, 404 for what does not exist or is not yours to see, 409 for a stale revision, 413 for a body over 5 MB, 429
              when asking too often.
            </p>
          </div>
          <div>
            <h3 className="font-medium">Limits</h3>
            <p>
              Bodies up to 5 MB. Computing (solve, ladder, study and study jobs) spends a budget per account, by the network's size;
              a 429 answer says how long to wait in its <code>Retry-After</code> header. A request that computes is stopped after 60 s
              (503); a study job after 5 minutes.
            </p>
          </div>
        </aside>
      </div>
    </>
  );
}
