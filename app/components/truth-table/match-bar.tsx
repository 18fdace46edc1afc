// Above the truth table: how many rows match, the condition filters as tokens that remove themselves,
// "Clear filters", and the CSV of the rows that match.
import type { FilterQuery } from "~/reviews/truth-table";
import { Button, buttonVariants } from "~/components/ui/button";

export function MatchBar({
  total,
  totalRows,
  loading,
  query,
  onQuery,
  csvHref,
}: {
  /** Rows that match the filters. */
  total: number;
  totalRows: number;
  loading: boolean;
  query: FilterQuery;
  onQuery: (q: FilterQuery) => void;
  csvHref: string;
}) {
  return (
    <div className="mb-2 flex flex-wrap items-center justify-between gap-3">
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <p aria-live="polite" data-testid="match-count">
          <strong>{total.toLocaleString("en-US")}</strong> of {totalRows.toLocaleString("en-US")} rows match
          {loading ? <span className="text-ink-500"> · loading…</span> : null}
        </p>
        {query.where.map((w) => (
          <Button
            key={`${w.cond}:${w.state}`}
            type="button"
            layout="tight"
            variant="token"
            size="pill"
            onClick={() => onQuery({ ...query, where: query.where.filter((x) => x !== w) })}
            aria-label={`Remove filter ${w.cond} = ${w.state}`}
          >
            {w.cond} = {w.state} <span aria-hidden="true">✕</span>
          </Button>
        ))}
        {query.only || query.rule || query.where.length > 0 ? (
          <Button type="button" variant="link" size="inline-strong" onClick={() => onQuery({ where: [] })}>
            Clear filters
          </Button>
        ) : null}
      </div>
      <a href={csvHref} className={buttonVariants({ variant: "secondary" })} download>
        Download CSV{query.only || query.where.length > 0 ? " (filtered)" : ""}
      </a>
    </div>
  );
}
