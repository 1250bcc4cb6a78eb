import { type RouteConfig, index, prefix, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),

  route("sign-in", "routes/auth/sign-in.tsx"),
  route("sign-up", "routes/auth/sign-up.tsx"),
  route("sign-out", "routes/auth/sign-out.tsx"),
  route("account", "routes/auth/account.tsx"),
  route("account/tokens", "routes/auth/api-tokens.ts"),
  route("docs/api", "routes/docs/api.tsx"),

  ...prefix("networks", [
    index("routes/networks/list.tsx"),
    route("upload", "routes/networks/upload.tsx"),
    route(":networkId", "routes/networks/network.tsx"),
    route(":networkId/loads-import", "routes/networks/loads-import.tsx"),
    route(":networkId/ladder", "routes/networks/ladder.tsx"),
    route(":networkId/report", "routes/networks/report.tsx"),
  ]),

  ...prefix("teams", [
    index("routes/teams/list.tsx"),
    route("new", "routes/teams/new.tsx"),
    route(":teamId", "routes/teams/team.tsx"),
    route(":teamId/library", "routes/teams/library.tsx"),
  ]),

  ...prefix("api", [
    route("schema", "routes/api/schema.ts"),
    route("solve", "routes/api/solve.ts"),
    route("networks", "routes/api/networks.ts"),
    route("networks/:networkId", "routes/api/network.ts"),
    route("networks/:networkId/solve", "routes/api/network-solve.ts"),
    route("networks/:networkId/export", "routes/api/network-export.ts"),
    route("networks/:networkId/ladder", "routes/api/ladder.ts"),
  ]),
] satisfies RouteConfig;
