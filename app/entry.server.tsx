// The server's HTML rendering: React Router's default streaming render, plus a fresh nonce per
// page for the content security policy (ServerRouter puts it on React Router's own inline
// scripts, and Scripts/ScrollRestoration take it from there) and the common security headers.
import { PassThrough } from "node:stream";
import type { EntryContext, HandleErrorFunction } from "react-router";
import { createReadableStreamFromReadable } from "@react-router/node";
import { ServerRouter } from "react-router";
import { isbot } from "isbot";
import type { ReactElement } from "react";
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

  const userAgent = request.headers.get("user-agent");
  // Crawlers get the whole page at once; people get the shell first and the rest streamed.
  const allReady = Boolean((userAgent && isbot(userAgent)) || routerContext.isSpaMode);
  return renderDocument(request, responseStatusCode, responseHeaders, <ServerRouter context={routerContext} url={request.url} nonce={nonce} />, {
    nonce,
    allReady,
    timeoutMs: streamTimeout + 1000,
  });
}

/**
 * Render `element` as the HTML answer. Past `timeoutMs` the render is cut off; that is never a 500
 * on its own: a form post whose action has already done its work (a status below 400) is answered
 * 303 to the same address, so the browser shows the page afresh with the work saved instead of an
 * error that invites a second submission; any other request keeps its status, with what was ready.
 */
export function renderDocument(
  request: Request,
  status: number,
  responseHeaders: Headers,
  element: ReactElement,
  options: { nonce?: string; allReady: boolean; timeoutMs: number },
): Promise<Response> {
  let responseStatusCode = status;
  return new Promise((resolve, reject) => {
    let settled = false;
    let timedOut = false;
    const submitted = !["GET", "HEAD"].includes(request.method.toUpperCase()) && status < 400;
    const seeAgain = () => {
      settled = true;
      const headers = new Headers(responseHeaders);
      headers.delete("Content-Type");
      headers.set("Location", new URL(request.url).pathname + new URL(request.url).search);
      resolve(new Response(null, { status: 303, headers }));
    };

    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => {
      timedOut = true;
      abort();
    }, options.timeoutMs);

    const ready = () => {
      if (settled) return;
      if (timedOut && submitted) {
        seeAgain();
        return;
      }
      settled = true;
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
    };

    const { pipe, abort } = renderToPipeableStream(element, {
      nonce: options.nonce,
      ...(options.allReady ? { onAllReady: ready } : { onShellReady: ready }),
      onShellError(error: unknown) {
        clearTimeout(timeoutId);
        if (timedOut && submitted) seeAgain();
        else reject(error);
      },
      onError(error: unknown) {
        // Our own cut-off is no error of the page: what was ready goes out with the status it had.
        if (timedOut) return;
        responseStatusCode = 500;
        // Errors before the shell reject above and are logged by React Router; later ones only here.
        if (settled) console.error(error);
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
