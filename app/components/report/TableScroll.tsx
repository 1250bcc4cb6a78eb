// The pieces every report and study table shares: the box a wide table scrolls in, the table's
// class, and a shared results column (solver/resultTables.ts, solver/study/tables.ts) as a column.
import type { ReactNode } from "react";
import type { Column } from "#app/components/DataTable.tsx";
import { readingNumber } from "#app/lib/format.ts";
import { QUANTITY_UNIT } from "#solver/quantities.ts";
import type { ResultColumn } from "#solver/resultTables.ts";

export const REPORT_TABLE = "data-table ks-report-table";

/**
 * A wide table scrolls sideways in its own box on screen, its first column (the names) kept in
 * view, so a phone never scrolls the whole report sideways; on paper the box lets it run full width.
 */
export function TableScroll({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="ks-table-scroll ks-report-scroll" tabIndex={0} role="region" aria-label={label}>
      {children}
    </div>
  );
}

/** A shared results column as a report column: figures at their quantity's precision; `cell` overrides how its value is written. */
export function reportColumn<T>(column: ResultColumn<T>, cell?: (row: T) => ReactNode): Column<T> {
  const quantity = column.quantity;
  return {
    header: column.header,
    unit: quantity ? QUANTITY_UNIT[quantity] || undefined : undefined,
    numeric: quantity !== undefined,
    cell: cell ?? ((row) => (quantity ? readingNumber(column.value(row) as number | null, quantity) : String(column.value(row) ?? ""))),
  };
}
