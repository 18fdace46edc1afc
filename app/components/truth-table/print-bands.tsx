// The printed truth table: the whole table in bands as wide as the paper (the report's section).
import type { TableColumns, TableRow } from "~/reviews/truth-table";
import { describeBand, printBands } from "~/reviews/print-bands";
import { TruthTableGrid } from "./grid";

/**
 * The whole table in bands as wide as the paper: each repeats the row number and the conditions
 * (app/reviews/print-bands.ts), so no column is cut off at the page's edge.
 */
export function TruthTableBands({ columns, rows }: { columns: TableColumns; rows: TableRow[] }) {
  const bands = printBands(columns, rows.length);
  return (
    <>
      {bands.length > 1 ? (
        <p className="mt-2 text-ink-600">The table is printed in {bands.length} parts; each repeats the row number and the conditions.</p>
      ) : null}
      {bands.map((band, i) => {
        const what = describeBand(band, columns);
        return (
          <div key={i} className={`mt-3 ${i > 0 ? "break-before-page" : ""}`}>
            {bands.length > 1 ? (
              <h3 className="font-semibold">
                Part {i + 1} of {bands.length}: conditions with {what}
              </h3>
            ) : null}
            <div className="mt-1">
              <TruthTableGrid
                columns={columns}
                rows={rows}
                band={band}
                dense
                sticky={false}
                caption={bands.length > 1 ? `Truth table, part ${i + 1}: ${what}` : "Full truth table"}
              />
            </div>
          </div>
        );
      })}
    </>
  );
}
