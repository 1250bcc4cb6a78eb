// The server's HTML rendering: React Router's default streaming render, plus a fresh nonce per
// page for the content security policy (ServerRouter puts it on React Router's own inline
// scripts, and Scripts/ScrollRestoration take it from there) and the common security headers.
import { PassThrough } from "node:stream";
import type { EntryContext, HandleErrorFunction } from "react-router";
import { createReadableStreamFromReadable } from "@react-router/node";
import { ServerRouter } from "react-router";
import { isbot } from "isbot";
import type { RenderToPipeableStreamOptions } from "react-dom/server";
import { renderToPipeableStream } from "react-dom/server";
import { createNonce, setSecurityHeaders } from "./lib/securityHeaders.server.ts";

export const streamTimeout = 5_000;

export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
) {
  const nonce = createNonce();
  setSecurityHeaders(responseHeaders, nonce);

  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }

  return new Promise((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    // Crawlers get the whole page at once; people get the shell first and the rest streamed.
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";

    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);

    const { pipe, abort } = renderToPipeableStream(<ServerRouter context={routerContext} url={request.url} nonce={nonce} />, {
      nonce,
      [readyOption]() {
        shellRendered = true;
        const body = new PassThrough({
          final(callback) {
            clearTimeout(timeoutId);
            timeoutId = undefined;
            callback();
          },
        });
        const stream = createReadableStreamFromReadable(body);
        responseHeaders.set("Content-Type", "text/html");
        pipe(body);
        resolve(new Response(stream, { headers: responseHeaders, status: responseStatusCode }));
      },
      onShellError(error: unknown) {
        reject(error);
      },
      onError(error: unknown) {
        responseStatusCode = 500;
        // Errors before the shell reject above and are logged by React Router; later ones only here.
        if (shellRendered) console.error(error);
      },
    });
  });
}

/** Errors are logged on the server, in full; the client only ever sees the sanitized message. */
export const handleError: HandleErrorFunction = (error, { request }) => {
  if (!request.signal.aborted) console.error(error);
};

/** Loader and action data for client navigations carry the common security headers too. */
export function handleDataRequest(response: Response): Response {
  setSecurityHeaders(response.headers);
  return response;
}
