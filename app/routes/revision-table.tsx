// The truth table of one saved revision, paged on the server: filters and the position live in the
// URL; pages come from the rows API through swr (the first one is rendered by the loader).
import { useEffect, useRef, useState } from "react";
import { Link, useSearchParams, type ShouldRevalidateFunctionArgs } from "react-router";
import useSWR from "swr";
import type { Route } from "./+types/revision-table";
import { requireRevisionPage } from "~/reviews/access.server";
import { compiledRevision } from "~/reviews/compiled.server";
import { reviewStatusOf } from "~/reviews/reviews.server";
import { tableColumns } from "~/reviews/truth-table.server";
import { filterOf, filterSearch, parseFilterQuery, tableRow, type FilterQuery, type RowsPage } from "~/reviews/truth-table";
import { csvApiPath, reportPath, reviewPath, rowApiPath, rowsApiPath, simulateRowPath } from "~/reviews/paths";
import { designPath } from "~/designs/paths";
import { pageRows } from "~/engine";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Notice } from "~/components/ui/form";
import { buttonVariants } from "~/components/ui/button";
import { ButtonLink } from "~/components/ui/link";
import { cardVariants } from "~/components/ui/card";
import { TruthTableGrid } from "~/components/truth-table/grid";
import { RowDrawer } from "~/components/truth-table/row-drawer";
import { api as endpoints } from "~/api/endpoints";
import { ApiError, apiFetcher } from "~/api/client";
import { ReviewStatusBadge } from "~/components/truth-table/review-status";
import { RowFilters } from "~/components/truth-table/row-filters";
import { MatchBar } from "~/components/truth-table/match-bar";
import { Pager } from "~/components/truth-table/pager";
import { RefusedNotice } from "~/components/refused-mark";
import { standingsFor } from "~/designs/standing.server";

const PAGE = 100;
const fetchRows = apiFetcher(endpoints.revisionRows);

function fromOf(params: URLSearchParams): number {
  const raw = params.get("from");
  return raw && /^[0-9]{1,10}$/.test(raw) ? Number(raw) : 0;
}

function rowOf(params: URLSearchParams): number | null {
  const raw = params.get("row");
  return raw && /^[0-9]{1,10}$/.test(raw) ? Number(raw) : null;
}

function pageKey(api: string, q: FilterQuery, from: number): string {
  const p = filterSearch(q);
  p.set("from", String(from));
  p.set("count", String(PAGE));
  return `${api}?${p}`;
}

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { member, design, ref } = await requireRevisionPage(context, params, "workspace.view");
  const compiled = await compiledRevision(member.workspace.id, ref);
  const columns = tableColumns(compiled);
  const search = new URL(request.url).searchParams;
  const parsed = parseFilterQuery(search);
  let query: FilterQuery = parsed.ok ? parsed.query : { where: [] };
  let filterError: string | null = parsed.ok ? null : parsed.fields.map((f) => `${f.path}: ${f.message}`).join("; ");
  const from = fromOf(search);
  let page: RowsPage;
  try {
    const p = pageRows(compiled, { filter: filterOf(query), from, count: PAGE });
    page = { total: p.total, from, rows: p.rows.map((v) => tableRow(columns, v)) };
  } catch (e) {
    filterError = e instanceof Error ? e.message : "The filter could not be applied.";
    query = { where: [] };
    const p = pageRows(compiled, { from: 0, count: PAGE });
    page = { total: p.total, from: 0, rows: p.rows.map((v) => tableRow(columns, v)) };
  }
  const [statuses, standings] = await Promise.all([
    reviewStatusOf(member.workspace.id, [design.id]),
    standingsFor(member.workspace.id, [ref.id]),
  ]);
  const status = statuses.get(design.id)?.byNumber.get(ref.number)?.status ?? "not-requested";
  const standing = standings.get(ref.id);
  return {
    slug: member.workspace.slug,
    design: { id: design.id, name: design.name },
    revision: { number: ref.number, contentHash: ref.contentHash, status, refused: standing && !standing.passes ? standing.reasons : null },
    rows: compiled.rows,
    columns,
    initial: { key: pageKey(rowsApiPath(design.id, ref.number), query, page.from), page },
    filterError,
  };
}

// Filters and paging change only the query string: the page fetches rows itself, no loader rerun.
export function shouldRevalidate({ currentUrl, nextUrl, formMethod, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (!formMethod && currentUrl.pathname === nextUrl.pathname) return false;
  return defaultShouldRevalidate;
}

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Truth table · ${data?.design.name ?? "Design"} r${data?.revision.number ?? ""} · Chainproof` },
];

export default function RevisionTable({ loaderData }: Route.ComponentProps) {
  const { slug, design, revision, rows: totalRows, columns, initial, filterError } = loaderData;
  const [params, setParams] = useSearchParams();
  const parsed = parseFilterQuery(params);
  const query: FilterQuery = parsed.ok ? parsed.query : { where: [] };
  const from = fromOf(params);
  const selected = rowOf(params);
  const api = rowsApiPath(design.id, revision.number);
  const key = pageKey(api, query, from);
  // The loader's page is fresh (revisions never change): no refetch of it on mount.
  const isInitial = key === initial.key;
  const { data, error, isValidating } = useSWR(key, fetchRows, {
    fallbackData: isInitial ? initial.page : undefined,
    revalidateOnMount: !isInitial,
    revalidateIfStale: false,
    keepPreviousData: true,
    revalidateOnFocus: false,
  });
  const isLoading = isValidating && !isInitial;
  const page = data ?? initial.page;
  // The row a jump asked for: scrolled into view once its page is on screen.
  // (a counter, so a second jump to a row already on the page scrolls again)
  const scrollTarget = useRef<number | null>(null);
  const [jumps, setJumps] = useState(0);
  const tableBox = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const want = scrollTarget.current;
    if (want === null || !page.rows.some((r) => r.index === want)) return;
    tableBox.current?.querySelector(`tr[data-row="${want}"]`)?.scrollIntoView({ block: "center", inline: "nearest" });
    scrollTarget.current = null;
  }, [jumps, page]);

  const update = (change: (p: URLSearchParams) => void) => {
    const next = new URLSearchParams(params);
    change(next);
    setParams(next, { preventScrollReset: true, replace: true });
  };
  const setQuery = (q: FilterQuery) =>
    update((p) => {
      for (const k of ["only", "rule", "where", "from"]) p.delete(k);
      for (const [k, v] of filterSearch(q)) p.append(k, v);
    });
  const select = (index: number | null) => update((p) => (index === null ? p.delete("row") : p.set("row", String(index))));

  const csvHref = `${csvApiPath(design.id, revision.number)}${filterSearch(query).size > 0 ? `?${filterSearch(query)}` : ""}`;

  function jumpTo(n: number) {
    // Row N of the whole table: clear the filters, page to it, open it and scroll it into view.
    scrollTarget.current = n;
    setJumps((j) => j + 1);
    update((p) => {
      for (const k of ["only", "rule", "where"]) p.delete(k);
      p.set("from", String(Math.floor(n / PAGE) * PAGE));
      p.set("row", String(n));
    });
  }

  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={designPath(slug, design.id)} className="text-copper-700 underline">
          {design.name}
        </Link>
      </p>
      <PageHeader
        title={`Truth table, revision ${revision.number}`}
        description={
          <span className="inline-flex flex-wrap items-center gap-2">
            <ReviewStatusBadge status={revision.status} /> {totalRows.toLocaleString("en-US")} rows, computed on the server a page at a
            time.
          </span>
        }
        actions={
          <>
            <ButtonLink to={reviewPath(slug, design.id, revision.number)} variant="secondary">
              Review
            </ButtonLink>
            <a href={reportPath(slug, design.id, revision.number)} className={buttonVariants({ variant: "secondary" })}>
              Report
            </a>
          </>
        }
      />

      {revision.refused ? <RefusedNotice reasons={revision.refused} className="mb-4" /> : null}
      {filterError ? <Notice tone="error">The filter in the address was ignored: {filterError}</Notice> : null}

      <RowFilters columns={columns} query={query} onQuery={setQuery} totalRows={totalRows} onJump={jumpTo} />

      <MatchBar total={page.total} totalRows={totalRows} loading={isLoading} query={query} onQuery={setQuery} csvHref={csvHref} />

      {error ? <Notice tone="error">{error instanceof ApiError ? error.detail : "The rows could not be loaded."}</Notice> : null}

      <div
        ref={tableBox}
        className={cardVariants({ padding: "none", className: "max-h-[70vh] overflow-auto" })}
        data-testid="table-scroller"
      >
        {page.rows.length === 0 ? (
          <p className="p-6 text-center text-sm text-ink-600">No row matches these filters.</p>
        ) : (
          <TruthTableGrid
            columns={columns}
            rows={page.rows}
            selected={selected}
            onSelect={(i) => select(i)}
            caption={`Truth table of revision ${revision.number}`}
          />
        )}
      </div>

      <Pager
        page={page}
        totalRows={totalRows}
        position={from}
        pageSize={PAGE}
        filtered={Boolean(query.only || query.where.length > 0)}
        onPosition={(n) => update((p) => p.set("from", String(n)))}
      />

      <SafetyNote className="mt-5" />

      {selected !== null && selected < totalRows ? (
        <RowDrawer
          key={selected}
          columns={columns}
          index={selected}
          apiPath={rowApiPath(design.id, revision.number, selected)}
          simulateHref={simulateRowPath(slug, design.id, revision.number, selected)}
          commentHref={`${reviewPath(slug, design.id, revision.number)}?row=${selected}#comment`}
          onClose={() => select(null)}
        />
      ) : null}
    </>
  );
}
