// Checks a request passes before a route does any work. They run where every route already
// resolves its caller (requireUser for pages, requireApiUser for the API, and the sign-in and
// sign-up actions), so no route can forget them: a write from another site's page is refused,
// and a body over the size limit is refused before it is read. (What computing costs is paid
// from one budget where the work is asked for: compute/budget.server.ts.)
import { data } from "react-router";
import { UPLOAD_LIMIT_BYTES } from "./imports/uploadLimits.ts";
import { CROSS_ORIGIN_MESSAGE, isCrossOriginWrite } from "./originCheck.server.ts";

/** A 5 MB file plus the multipart envelope and the form's other fields. */
export const REQUEST_BODY_LIMIT_BYTES = UPLOAD_LIMIT_BYTES + 64 * 1024;

interface Refusal {
  status: number;
  error: string;
  headers?: Record<string, string>;
}

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

function bodySizeRefusal(request: Request): Refusal | null {
  const declared = request.headers.get("Content-Length");
  if (declared === null) {
    // A streamed body of unknown length could be any size; ask for the length instead.
    if (request.headers.has("Transfer-Encoding"))
      return { status: 411, error: "Send the request with a Content-Length header; bodies of unknown length are not accepted." };
    return null;
  }
  const bytes = Number(declared);
  if (!Number.isFinite(bytes) || bytes < 0) return { status: 400, error: "The Content-Length header is not a number." };
  if (bytes > REQUEST_BODY_LIMIT_BYTES)
    return {
      status: 413,
      error: `The request is ${megabytes(bytes)}; Kilostep accepts at most ${megabytes(REQUEST_BODY_LIMIT_BYTES)} (a file of at most ${megabytes(UPLOAD_LIMIT_BYTES)}).`,
    };
  return null;
}

function writeRefusal(request: Request): Refusal | null {
  if (isCrossOriginWrite(request)) return { status: 403, error: CROSS_ORIGIN_MESSAGE };
  return bodySizeRefusal(request);
}

/** Page actions that read JSON (the ladder page's fetcher); every other page action reads a form. */
const JSON_PAGE_ACTIONS = [/^\/networks\/[^/]+\/ladder(\.data)?\/?$/];
const FORM_TYPES = ["application/x-www-form-urlencoded", "multipart/form-data"];

/**
 * A page write must be a POST carrying what its action reads (a form, or JSON where the page sends
 * JSON); anything else would fail in the action's reading of the body, so it is refused in words.
 */
function pageBodyRefusal(request: Request): Refusal | null {
  const method = request.method.toUpperCase();
  if (method === "GET" || method === "HEAD") return null;
  if (method !== "POST")
    return { status: 405, error: `Pages take changes by POST only, not ${method}. Scripts use the HTTP API (see /docs/api).`, headers: { Allow: "GET, POST" } };
  const type = (request.headers.get("Content-Type") ?? "").split(";")[0].trim().toLowerCase();
  const wantsJson = JSON_PAGE_ACTIONS.some((pattern) => pattern.test(new URL(request.url).pathname));
  const accepted = wantsJson ? ["application/json"] : FORM_TYPES;
  if (accepted.includes(type)) return null;
  return {
    status: 415,
    error: `This page takes ${wantsJson ? "JSON (application/json)" : "a form (application/x-www-form-urlencoded or multipart/form-data)"}, and the request sent ${type ? type : "no Content-Type"}.`,
  };
}

/** For pages and their forms: a refusal is a thrown data() that the error boundary shows in words. */
export function guardPageRequest(request: Request): void {
  const refusal = writeRefusal(request) ?? pageBodyRefusal(request);
  if (refusal) throw data(refusal.error, { status: refusal.status, headers: refusal.headers });
}

/** For the API: a refusal is a thrown JSON answer in the API's error shape. */
export function guardApiRequest(request: Request): void {
  const refusal = writeRefusal(request);
  if (refusal) throw Response.json({ error: refusal.error }, { status: refusal.status, headers: refusal.headers });
}
