// The production server (`npm start`, `npm run demo`): Express around React Router's request
// handler, as react-router-serve does, plus what that one cannot be told to do:
// - every answer carries the security headers, API JSON, downloads and static files included;
// - the access log shows link secrets as "[secret]";
// - the client's address comes from the socket, or from X-Forwarded-For only when TRUST_PROXY
//   names the proxy, and reaches loaders and actions through the load context;
// - it listens on HOST (loopback unless a deployment says otherwise).
// Run with tsx: `node --import tsx app/server.ts [build/server/index.js]`.
import path from "node:path";
import { pathToFileURL } from "node:url";
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";
import morgan from "morgan";
import type { ServerBuild } from "react-router";
import { env } from "#app/lib/env.server.ts";
import { redactSecretsInUrl } from "#app/lib/secretTokens.server.ts";
import { commonSecurityHeaders } from "#app/lib/securityHeaders.server.ts";

const buildPath = path.resolve(process.argv[2] ?? "build/server/index.js");
const build = (await import(pathToFileURL(buildPath).href)) as ServerBuild;
const clientFolder = path.resolve(path.dirname(buildPath), "../client");

const app = express();
app.disable("x-powered-by");
app.set("trust proxy", env.trustProxy);

// Added as the head goes out, where React Router's own answer has not set them already: the
// adapter appends its headers, so setting them up front would send each one twice.
app.use((_request, response, next) => {
  const writeHead = response.writeHead;
  response.writeHead = function (this: typeof response, ...args: Parameters<typeof writeHead>) {
    for (const [name, value] of Object.entries(commonSecurityHeaders)) if (!this.hasHeader(name)) this.setHeader(name, value);
    return writeHead.apply(this, args);
  } as typeof writeHead;
  next();
});
// gzip at its fastest level: pages are made per request, and the default level spends more
// CPU per page than it saves on a local network (a proxy in front may compress harder).
app.use(compression({ level: 1 }));
// Fingerprinted bundles never change under their name; everything else in the client folder
// (fonts, icons, robots.txt) may change with a release.
app.use("/assets", express.static(path.join(clientFolder, "assets"), { immutable: true, maxAge: "1y" }));
app.use(express.static(clientFolder, { maxAge: "1h" }));

morgan.token("redacted-url", (request) => redactSecretsInUrl((request as express.Request).originalUrl));
app.use(morgan(":method :redacted-url :status :res[content-length] - :response-time ms"));

app.all(
  "*",
  createRequestHandler({
    build,
    mode: process.env.NODE_ENV,
    getLoadContext: (request) => ({ clientAddress: request.ip ?? null }),
  }),
);

const server = app.listen(env.port, env.host, () => {
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : env.port;
  console.log(`Kilostep listens on http://${env.host.includes(":") ? `[${env.host}]` : env.host}:${port} (links point to ${env.appOrigin})`);
});

for (const signal of ["SIGTERM", "SIGINT"] as const) {
  process.once(signal, () => server.close(() => process.exit(0)));
}
