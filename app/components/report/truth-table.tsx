// The report's truth table: its counts, then every row in bands that fit the paper's width, or, when
// that would take too many pages, where the CSV of the whole table is.
import type { Verdict } from "~/engine";
import type { TableColumns, TableRow } from "~/reviews/truth-table";
import { TruthTableBands } from "~/components/truth-table/print-bands";
import { h2 } from "./paper";

export function ReportTruthTable({
  rows,
  verdict,
  columns,
  table,
  tablePages,
  pageLimit,
  paper,
  csvUrl,
}: {
  /** Rows of the whole table. */
  rows: number;
  verdict: Verdict;
  columns: TableColumns;
  /** Every row, or null when the table is not printed. */
  table: TableRow[] | null;
  /** Pages the printed table would take. */
  tablePages: number;
  /** The most pages the table is printed on. */
  pageLimit: number;
  /** The paper's name (A4, Letter), which the page count is for. */
  paper: string;
  csvUrl: string;
}) {
  return (
    // A printed table starts a page, as every further band does: the page count above holds on paper.
    <section aria-label="Truth table" className={table ? "break-before" : undefined}>
      <h2 className={h2}>Truth table</h2>
      <p className="mt-2">
        {rows.toLocaleString("en-US")} rows; the drive is on in {verdict.driveRows.toLocaleString("en-US")}.{" "}
        {verdict.rules
          .filter((r) => "unsafeRows" in r)
          .map((r) => ("unsafeRows" in r ? `${r.id}: ${r.unsafeRows} unsafe, ${r.violatingRows} violating` : ""))
          .join("; ")}
      </p>
      {table ? (
        <>
          <p className="mt-2" data-testid="report-table-pages">
            The full table follows, on at most {tablePages.toLocaleString("en-US")} {paper} pages (it is printed when it takes {pageLimit}{" "}
            or fewer).
          </p>
          <TruthTableBands columns={columns} rows={table} />
        </>
      ) : (
        <p className="mt-2">
          The full table is not printed: it would take about {tablePages.toLocaleString("en-US")} {paper} pages, more than {pageLimit}. The
          groups above describe every row; the whole table is the CSV at{" "}
          <a href={csvUrl} className="break-all text-copper-700 underline" data-testid="report-csv-url">
            {csvUrl}
          </a>{" "}
          (members of the workspace, signed in).
        </p>
      )}
    </section>
  );
}
