// Small helpers every JSON route shares: the error shape of api.md and body parsing that never
// throws anything but a 400 with a sentence.
import type { ValidationIssue } from "#solver/schema.ts";

export function apiError(status: number, error: string, issues?: ValidationIssue[]): Response {
  return Response.json(issues ? { error, issues } : { error }, { status });
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
