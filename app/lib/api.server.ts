// Small helpers every JSON route shares: the error shape of api.md and body parsing that never
// throws anything but a 400 with a sentence.
import type { ValidationIssue } from "#solver/schema.ts";

/** Problems listed in one answer; a document with more gets the first ones and the count of all. */
export const ISSUES_LISTED_MAX = 100;

export function apiError(status: number, error: string, issues?: ValidationIssue[]): Response {
  if (!issues) return Response.json({ error }, { status });
  if (issues.length <= ISSUES_LISTED_MAX) return Response.json({ error, issues }, { status });
  return Response.json(
    {
      error: `${error} It has ${issues.length.toLocaleString("en")} problems; the first ${ISSUES_LISTED_MAX} are listed.`,
      issues: issues.slice(0, ISSUES_LISTED_MAX),
      issueCount: issues.length,
    },
    { status },
  );
}

/** The request body as JSON, or a thrown 400 that says why it is not. */
export async function readJsonBody(request: Request): Promise<unknown> {
  const text = await request.text();
  if (text.trim() === "") throw apiError(400, "The request body is empty; send a JSON document.");
  try {
    return JSON.parse(text);
  } catch (error) {
    const reason = error instanceof SyntaxError ? error.message : String(error);
    throw apiError(400, `The request body is not valid JSON: ${reason}`);
  }
}

/** A route parameter that must be a positive integer id; null when it is not one. */
export function parseId(value: string | null | undefined): number | null {
  if (!value || !/^[1-9]\d{0,15}$/.test(value)) return null;
  const id = Number(value);
  return Number.isSafeInteger(id) ? id : null;
}

/** Prefix issue paths with where the document sits in the body (e.g. `document.buses[0].id`). */
export function issuesUnder(prefix: string, issues: ValidationIssue[]): ValidationIssue[] {
  return issues.map((issue) => ({ path: issue.path ? `${prefix}.${issue.path}` : prefix, message: issue.message }));
}

/** The sentence for a request its computation refused: the first problem, and how many more follow. */
export function refusedRequestSentence(what: string, issues: readonly ValidationIssue[]): string {
  const [first, ...more] = issues;
  const firstText = first.path ? `${first.path} ${first.message}` : first.message;
  return `The ${what} request cannot be run: ${firstText}${more.length > 0 ? ` (and ${more.length} more, listed in issues)` : ""}.`;
}
