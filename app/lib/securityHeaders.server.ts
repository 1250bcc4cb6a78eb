// Headers every response carries, and the content security policy of the HTML pages.
//
// Scripts: React Router writes two kinds of inline script into each page (the hydration context
// and the module that boots the client). Rather than allow every inline script, each page gets a
// fresh nonce that ServerRouter puts on exactly those scripts, so an injected <script> has none.
// Styles: 'unsafe-inline' stays for style-src because React renders `style` attributes (the
// sheet's canvas positions every node and wire that way); a style cannot run code.
import { randomBytes } from "node:crypto";

export function createNonce(): string {
  return randomBytes(16).toString("base64");
}

export function contentSecurityPolicy(nonce: string): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}'`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** For every response, pages, API and files alike. */
export const commonSecurityHeaders: Readonly<Record<string, string>> = {
  "X-Content-Type-Options": "nosniff",
  "X-Frame-Options": "DENY",
  // Share links carry their secret in the path; no other site may see it as a referrer.
  "Referrer-Policy": "same-origin",
  "Cross-Origin-Opener-Policy": "same-origin",
  "Permissions-Policy": "camera=(), microphone=(), geolocation=(), payment=()",
};

export function setSecurityHeaders(headers: Headers, nonce?: string): void {
  for (const [name, value] of Object.entries(commonSecurityHeaders)) if (!headers.has(name)) headers.set(name, value);
  if (nonce !== undefined) headers.set("Content-Security-Policy", contentSecurityPolicy(nonce));
}
