// What an import found wrong, listed so a planner can fix the file: document paths for a network
// file, row and column for a CSV. The list is capped; the total is always said.
import type { ValidationIssue } from "#solver/schema.ts";
import type { RowError } from "#app/lib/imports/csvTable.ts";

export function PathProblems({ issues, total }: { issues: ValidationIssue[]; total: number }) {
  if (issues.length === 0) return null;
  return (
    <div className="mt-3">
      <table className="data-table">
        <caption className="text-left">
          {total} problem{total === 1 ? "" : "s"}
          {total > issues.length ? ` (the first ${issues.length} shown)` : ""}
        </caption>
        <thead>
          <tr>
            <th scope="col">Where</th>
            <th scope="col">What is wrong</th>
          </tr>
        </thead>
        <tbody>
          {issues.map((issue, i) => (
            <tr key={i}>
              <td>
                <code>{issue.path || "(the document)"}</code>
              </td>
              <td>{issue.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function RowProblems({ errors, total }: { errors: RowError[]; total: number }) {
  if (errors.length === 0) return null;
  return (
    <div className="relative mt-3 overflow-x-auto">
      <table className="data-table">
        <caption className="text-left">
          {total} row error{total === 1 ? "" : "s"}
          {total > errors.length ? ` (the first ${errors.length} shown)` : ""}; rows are counted as in a spreadsheet, the
          header is row 1
        </caption>
        <thead>
          <tr>
            <th scope="col" className="num">
              Row
            </th>
            <th scope="col">Column</th>
            <th scope="col">What is wrong</th>
          </tr>
        </thead>
        <tbody>
          {errors.map((error, i) => (
            <tr key={i}>
              <td className="num">{error.row || "–"}</td>
              <td>{error.column ? <code>{error.column}</code> : "(whole row)"}</td>
              <td>{error.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
