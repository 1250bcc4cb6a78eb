import { type RouteConfig, index, prefix, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),

  route("sign-in", "routes/auth/sign-in.tsx"),
  route("sign-up", "routes/auth/sign-up.tsx"),
  route("sign-out", "routes/auth/sign-out.tsx"),
  route("account", "routes/auth/account.tsx"),
  route("account/notifications", "routes/auth/notifications.ts"),
  route("forgot-password", "routes/auth/forgot-password.tsx"),
  route("reset-password", "routes/auth/reset-password.tsx"),
  route("verify-email", "routes/auth/verify-email.tsx"),
  route("invitations/:token", "routes/teams/invitation.tsx"),
  route("s/:token", "routes/share/shared-network.tsx"),
  // The study report's own module, also reached through a view link (networkReader.server.ts).
  route("s/:token/report", "routes/networks/report.tsx", { id: "routes/share/shared-report" }),
  route("s/:token/results.csv", "routes/share/shared-results-csv.ts"),
  route("s/:token/notes", "routes/share/shared-notes.ts"),
  route("dev/mail", "routes/dev/mail.tsx"),
  route("dev/mail.json", "routes/dev/mail-json.ts"),
  route("account/tokens", "routes/auth/api-tokens.ts"),
  route("docs/api", "routes/docs/api.tsx"),

  ...prefix("networks", [
    index("routes/networks/list.tsx"),
    route("upload", "routes/networks/upload.tsx"),
    route(":networkId", "routes/networks/network.tsx"),
    route(":networkId/loads-import", "routes/networks/loads-import.tsx"),
    route(":networkId/ladder", "routes/networks/ladder.tsx"),
    route(":networkId/jobs/:jobId", "routes/networks/job.ts"),
    route(":networkId/report", "routes/networks/report.tsx"),
    route(":networkId/share", "routes/networks/share.tsx"),
    route(":networkId/notes", "routes/networks/notes.ts"),
    route(":networkId/revisions", "routes/networks/revisions.tsx"),
    route(":networkId/revisions/:number", "routes/networks/revision.tsx"),
  ]),

  ...prefix("teams", [
    index("routes/teams/list.tsx"),
    route("new", "routes/teams/new.tsx"),
    route(":teamId", "routes/teams/team.tsx"),
    route(":teamId/invitations", "routes/teams/invitations.ts"),
    route(":teamId/library", "routes/teams/library.tsx"),
  ]),

  ...prefix("api", [
    route("schema", "routes/api/schema.ts"),
    route("solve", "routes/api/solve.ts"),
    route("networks", "routes/api/networks.ts"),
    route("networks/:networkId", "routes/api/network.ts"),
    route("networks/:networkId/solve", "routes/api/network-solve.ts"),
    route("networks/:networkId/results.csv", "routes/api/results-csv.ts"),
    route("networks/:networkId/export", "routes/api/network-export.ts"),
    route("networks/:networkId/ladder", "routes/api/ladder.ts"),
    route("networks/:networkId/study", "routes/api/network-study.ts"),
    route("networks/:networkId/shares", "routes/api/network-shares.ts"),
    route("shares/:shareId", "routes/api/share.ts"),
    route("networks/:networkId/revisions", "routes/api/revisions.ts"),
    route("networks/:networkId/revisions/:number", "routes/api/revision.ts"),
  ]),
] satisfies RouteConfig;
