// The HTTP API as documented on /docs/api: every endpoint with a curl example. The examples are
// data, rendered to the curl lines the page shows; a browser test runs those very lines, in
// order, against the built app, so the page cannot drift from what the server does.

export type HttpMethod = "GET" | "POST" | "PUT" | "DELETE";

export interface ApiExample {
  /** Path and query after $KILOSTEP_URL, with shell variables such as $NETWORK_ID. */
  path: string;
  /** A JSON body written out, or a file sent as it is ("@network.json"). */
  body?: string;
  /** Save the answer to a file instead of printing it. */
  outputFile?: string;
  /** No token: the endpoint is public. */
  anonymous?: boolean;
  /** Variables later examples use, taken from this answer's JSON: name → top-level field. */
  captures?: Record<string, string>;
  /** What the example's lead sentence says it shows. */
  note?: string;
}

export interface ApiEndpoint {
  method: HttpMethod;
  /** The route as the router knows it, e.g. /api/networks/:networkId. */
  route: string;
  what: string;
  who: string;
  example: ApiExample;
}

export const API_ENDPOINTS: ApiEndpoint[] = [
  {
    method: "GET",
    route: "/api/schema",
    what: "The network file's JSON Schema.",
    who: "anyone, no token needed",
    example: { path: "/api/schema", anonymous: true, outputFile: "network.schema.json" },
  },
  {
    method: "GET",
    route: "/api/networks",
    what: "The networks you can see: id, name, team, your role, revision, when and by whom last changed.",
    who: "signed in (any token)",
    example: { path: "/api/networks" },
  },
  {
    method: "POST",
    route: "/api/networks",
    what: "Create a network from a network file; ?team=ID picks the team when you edit in more than one. Answers 201 with its id.",
    who: "editor or owner of the team (write token)",
    example: { path: "/api/networks?team=$TEAM_ID", body: "@network.json", captures: { NEW_NETWORK_ID: "id" } },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId",
    what: "One network: { id, name, revision, role, document }.",
    who: "viewer",
    example: { path: "/api/networks/$NETWORK_ID", outputFile: "current.json" },
  },
  {
    method: "PUT",
    route: "/api/networks/:networkId",
    what: "Save a new revision: { revision, document } with the revision you last read. A stale revision answers 409 with the current one and saves nothing.",
    who: "editor (write token)",
    example: {
      path: "/api/networks/$NETWORK_ID",
      body: "@put.json",
      note: 'put.json holds { "revision": 4, "document": { …the network file… } }, the revision being the one you read',
    },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId/export",
    what: "The current revision's network file as a download (?revision=N for an older one).",
    who: "viewer",
    example: { path: "/api/networks/$NETWORK_ID/export", outputFile: "exported-network.json" },
  },
  {
    method: "POST",
    route: "/api/networks/:networkId/solve",
    what: "Load flow, fault levels and checks for the saved revision; the same JSON as the command line.",
    who: "viewer (a read token may solve)",
    example: { path: "/api/networks/$NETWORK_ID/solve" },
  },
  {
    method: "POST",
    route: "/api/solve",
    what: "The same for a network file in the body; nothing is saved.",
    who: "signed in (a read token may solve)",
    example: { path: "/api/solve", body: "@network.json" },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId/results.csv",
    what: "The saved revision's results as RFC 4180 CSV with units in the header, as a download: ?table=buses or ?table=branches.",
    who: "viewer",
    example: { path: "/api/networks/$NETWORK_ID/results.csv?table=buses", outputFile: "buses.csv" },
  },
  {
    method: "POST",
    route: "/api/networks/:networkId/ladder",
    what: "The voltage ladder on the saved revision: { sectionBus, voltagesKV }, one alternative per candidate voltage; add sizing: { clearingTimeS } to have each alternative's section take the library conductor (built-in or the team's) that carries the load, keeps the buses beyond in band and withstands the fault at least lifetime cost (each alternative's sizing says which and why).",
    who: "viewer (a read token may run it)",
    example: { path: "/api/networks/$NETWORK_ID/ladder", body: '{"sectionBus": "$SECTION_BUS", "voltagesKV": [33, 66, 132]}' },
  },
  {
    method: "POST",
    route: "/api/networks/:networkId/study",
    what: "A study of the saved revision, waited for: every operating case, the envelope across them and the energy lost in a year; { outages: true } adds each line and transformer out in turn (or a list of case ids), { years: true } the years of load growth. The answer comes when the study is done, and a study still running after 60 s is stopped (503), so use this form for small networks and a job (below) for large ones or N-1.",
    who: "viewer (a read token may run it)",
    example: { path: "/api/networks/$NETWORK_ID/study", body: '{"outages": true}' },
  },
  {
    method: "POST",
    route: "/api/networks/:networkId/study/jobs",
    what: "The same study as a job: the same body, answered 202 at once with { id, state, progress, url } (and Location: url). The job runs on the server for up to 5 minutes; ask its url for progress and the result. At most two of your jobs run at once (429 beyond); the budget is spent when it starts.",
    who: "viewer (a read token may run it)",
    example: { path: "/api/networks/$NETWORK_ID/study/jobs", body: '{"outages": true}', captures: { STUDY_JOB_ID: "id" } },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId/study/jobs/:jobId",
    what: 'A study job: state ("running", "done", "failed", "cancelled" or "stopped"), progress { done, total, stage } in load flows, and once done { revision, study } with the study exactly as POST …/study answers it; a failed job carries status, error and issues. Kept 15 minutes after it ends; only whoever started it sees it.',
    who: "whoever started the job",
    example: { path: "/api/networks/$NETWORK_ID/study/jobs/$STUDY_JOB_ID", note: "$STUDY_JOB_ID is the id the POST answered; poll every second or two until state is no longer running" },
  },
  {
    method: "DELETE",
    route: "/api/networks/:networkId/study/jobs/:jobId",
    what: "Cancel a running study job (its computation stops at once); answers the job, now cancelled, or as it ended if it had finished.",
    who: "whoever started the job (a read token may cancel)",
    example: { path: "/api/networks/$NETWORK_ID/study/jobs/$STUDY_JOB_ID" },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId/revisions",
    what: "The revision list: number, when, by whom, message.",
    who: "viewer",
    example: { path: "/api/networks/$NETWORK_ID/revisions" },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId/revisions/:number",
    what: "One revision's document.",
    who: "viewer",
    example: { path: "/api/networks/$NETWORK_ID/revisions/1" },
  },
  {
    method: "GET",
    route: "/api/networks/:networkId/shares",
    what: "The network's share links: role, label, expiry, whether revoked, and who used them when.",
    who: "owner",
    example: { path: "/api/networks/$NETWORK_ID/shares" },
  },
  {
    method: "POST",
    route: "/api/networks/:networkId/shares",
    what: 'Create a share link: { "role": "viewer" or "editor", "expiresInDays" } → { id, url }.',
    who: "owner (write token)",
    example: { path: "/api/networks/$NETWORK_ID/shares", body: '{"role": "viewer", "expiresInDays": 14}', captures: { SHARE_ID: "id" } },
  },
  {
    method: "DELETE",
    route: "/api/shares/:shareId",
    what: "Revoke a share link at once.",
    who: "owner (write token)",
    example: { path: "/api/shares/$SHARE_ID" },
  },
  {
    method: "DELETE",
    route: "/api/networks/:networkId",
    what: "Delete a network; it can be restored from the networks page for 30 days.",
    who: "owner (write token)",
    example: { path: "/api/networks/$NEW_NETWORK_ID" },
  },
];

/** The shell variables the examples use, as the page explains them. */
export const EXAMPLE_VARIABLES: { name: string; meaning: string }[] = [
  { name: "KILOSTEP_URL", meaning: "where Kilostep runs, e.g. https://kilostep.example.org" },
  { name: "KILOSTEP_TOKEN", meaning: "an API token from your account page" },
  { name: "TEAM_ID", meaning: "a team's number, as in /teams/3" },
  { name: "NETWORK_ID", meaning: "a network's number, as in /networks/12" },
  { name: "SECTION_BUS", meaning: "the id of a bus in the section whose voltage the ladder varies" },
];

/** The curl line for an example, exactly as the page prints it and the test runs it. */
export function curlCommand(endpoint: ApiEndpoint): string {
  const { example } = endpoint;
  const parts = ["curl -sS"];
  // A body makes curl POST by itself; any other method is named.
  if (endpoint.method !== "GET" && !(endpoint.method === "POST" && example.body)) parts.push(`-X ${endpoint.method}`);
  if (!example.anonymous) parts.push('-H "Authorization: Bearer $KILOSTEP_TOKEN"');
  if (example.body !== undefined) {
    parts.push('-H "Content-Type: application/json"');
    parts.push(example.body.startsWith("@") ? `--data-binary ${example.body}` : `-d "${example.body.replaceAll('"', '\\"')}"`);
  }
  if (example.outputFile) parts.push(`-o ${example.outputFile}`);
  parts.push(`"$KILOSTEP_URL${example.path}"`);
  return parts.join(" ");
}
