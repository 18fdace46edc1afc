// Below the truth table: which rows this page shows, and the previous and next pages.
import { Button } from "~/components/ui/button";
import { PageLabel } from "./page-label";

export function Pager({
  page,
  totalRows,
  position,
  pageSize,
  filtered,
  onPosition,
}: {
  /** The page on screen, as the server returned it. */
  page: { rows: Array<{ index: number }>; total: number; from: number };
  totalRows: number;
  /** Where the URL asks the page to start among the matching rows; Previous and Next move it by a page. */
  position: number;
  pageSize: number;
  filtered: boolean;
  onPosition: (from: number) => void;
}) {
  const last = Math.min(page.total, page.from + page.rows.length);
  return (
    <nav className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages">
      <p data-testid="page-label">
        <PageLabel rows={page.rows} total={page.total} totalRows={totalRows} from={page.from} last={last} filtered={filtered} />
      </p>
      <div className="flex gap-2">
        <Button type="button" variant="secondary" disabled={position === 0} onClick={() => onPosition(Math.max(0, position - pageSize))}>
          Previous
        </Button>
        <Button
          type="button"
          variant="secondary"
          disabled={position + pageSize >= page.total}
          onClick={() => onPosition(position + pageSize)}
        >
          Next
        </Button>
      </div>
    </nav>
  );
}
