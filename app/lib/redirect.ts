/**
 * A redirect target from the query string or a form, accepted only when it is a path on this
 * site: "/networks/3" passes, "//evil.example", "https://…" and "/\\evil" fall back.
 */
export function safeRedirect(target: FormDataEntryValue | string | null | undefined, fallback = "/networks"): string {
  if (typeof target !== "string" || !target.startsWith("/") || target.startsWith("//") || target.includes("\\")) {
    return fallback;
  }
  // Control characters could split a header or confuse a browser's URL parser.
  if (/[\u0000-\u001f\u007f]/.test(target)) return fallback;
  return target;
}
