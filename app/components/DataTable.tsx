// One markup for the product's read-only tables: a caption, column headers with their unit set
// lighter after the name, the first cell of each row as that row's header, figures aligned right.
import type { ReactNode } from "react";

export interface Column<Row> {
  header: ReactNode;
  /** Written after the header, lighter: "kV", "Ω/km". */
  unit?: string;
  /** Figures: right-aligned, tabular, never wrapped. */
  numeric?: boolean;
  cell(row: Row): ReactNode;
}

export interface DataTableProps<Row> {
  caption?: ReactNode;
  /** The first column heads each row. */
  columns: readonly [Column<Row>, ...Column<Row>[]];
  rows: readonly Row[];
  rowKey(row: Row): string;
  /** Rows of a <tfoot>: totals under the table. */
  foot?: ReactNode;
  className?: string;
}

const figureClass = (numeric: boolean | undefined) => (numeric ? "num" : undefined);

export function DataTable<Row>({ caption, columns, rows, rowKey, foot, className = "data-table" }: DataTableProps<Row>) {
  const [head, ...rest] = columns;
  return (
    <table className={className}>
      {caption ? <caption>{caption}</caption> : null}
      <thead>
        <tr>
          {columns.map((column, i) => (
            <th key={i} scope="col" className={figureClass(column.numeric)}>
              {column.header}
              {column.unit ? (
                <>
                  {" "}
                  <span className="unit">{column.unit}</span>
                </>
              ) : null}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((row) => (
          <tr key={rowKey(row)}>
            <th scope="row" className={figureClass(head.numeric)}>
              {head.cell(row)}
            </th>
            {rest.map((column, i) => (
              <td key={i} className={figureClass(column.numeric)}>
                {column.cell(row)}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
      {foot ? <tfoot>{foot}</tfoot> : null}
    </table>
  );
}
