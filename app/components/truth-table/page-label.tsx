// The truth-table page's label of the rows it shows.
/**
 * Which rows this page shows, by the row numbers the table prints (0-based, as "Jump to row" takes
 * them); with a filter, also which of the matching rows they are (counted from 1).
 */
export function PageLabel({
  rows,
  total,
  totalRows,
  from,
  last,
  filtered,
}: {
  rows: Array<{ index: number }>;
  total: number;
  totalRows: number;
  from: number;
  last: number;
  filtered: boolean;
}) {
  if (total === 0 || rows.length === 0) return <>No rows</>;
  const n = (x: number) => x.toLocaleString("en-US");
  const span = `Rows ${n(rows[0]!.index)}–${n(rows.at(-1)!.index)}`;
  if (!filtered) return <>{`${span} of ${n(totalRows)}`}</>;
  return <>{`${span}: matches ${n(from + 1)}–${n(last)} of ${n(total)}`}</>;
}
