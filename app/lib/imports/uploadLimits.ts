// How large an uploaded file may be. Both the browser (before sending) and the server (before
// reading the body) ask here, so the planner sees the same sentence in either place.

/** 5 MB: a network of several thousand elements is well under 1 MB, a load list far less. */
export const UPLOAD_LIMIT_BYTES = 5 * 1024 * 1024;

/** Bytes the text takes as UTF-8, counted without building a copy of it. */
export function utf8ByteLength(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff && (text.charCodeAt(i + 1) & 0xfc00) === 0xdc00) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** A sentence when the file is over the limit, else null. `what` is e.g. "A network file". */
export function uploadTooLarge(bytes: number, what: string): string | null {
  if (bytes <= UPLOAD_LIMIT_BYTES) return null;
  return `${what} may be at most ${megabytes(UPLOAD_LIMIT_BYTES)}; this one is ${megabytes(bytes)}.`;
}

/** Drops a UTF-8 byte order mark, which spreadsheet programs put at the start of saved files. */
export function withoutByteOrderMark(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}
