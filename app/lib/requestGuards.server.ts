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

/** For pages and their forms: a refusal is a thrown data() that the error boundary shows in words. */
export function guardPageRequest(request: Request): void {
  const refusal = writeRefusal(request);
  if (refusal) throw data(refusal.error, { status: refusal.status, headers: refusal.headers });
}

/** For the API: a refusal is a thrown JSON answer in the API's error shape. */
export function guardApiRequest(request: Request): void {
  const refusal = writeRefusal(request);
  if (refusal) throw Response.json({ error: refusal.error }, { status: refusal.status, headers: refusal.headers });
}
