// The truth table of one saved revision, paged on the server: filters and the position live in the
// URL; pages come from the rows API through swr (the first one is rendered by the loader).
import { useEffect, useRef, useState, type FormEvent } from "react";
import { Link, useSearchParams, type ShouldRevalidateFunctionArgs } from "react-router";
import useSWR from "swr";
import type { Route } from "./+types/revision-table";
import { requireRevisionPage } from "~/reviews/access.server";
import { compiledRevision } from "~/reviews/compiled.server";
import { reviewStatusOf } from "~/reviews/reviews.server";
import { tableColumns } from "~/reviews/truth-table.server";
import {
  filterOf,
  filterSearch,
  ONLY,
  parseFilterQuery,
  tableRow,
  type FilterQuery,
  type Only,
  type RowsPage,
} from "~/reviews/truth-table";
import { csvApiPath, reportPath, reviewPath, rowApiPath, rowsApiPath, simulateRowPath } from "~/reviews/paths";
import { designPath } from "~/designs/paths";
import { pageRows } from "~/engine";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Notice } from "~/components/ui/form";
import { Button, buttonVariants } from "~/components/ui/button";
import { ButtonLink } from "~/components/ui/link";
import { Card, cardVariants } from "~/components/ui/card";
import { TruthTableGrid } from "~/components/truth-table/grid";
import { RowDrawer } from "~/components/truth-table/row-drawer";
import { api as endpoints } from "~/api/endpoints";
import { ApiError, apiFetcher } from "~/api/client";
import { ReviewStatusBadge } from "~/components/truth-table/review-status";
import { PageLabel } from "~/components/truth-table/page-label";
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

const selectClass =
  "mt-1 block w-full rounded-md border border-ink-300 bg-white px-2 py-2 text-base sm:text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/40";
const ONLY_LABELS: Record<Only, string> = {
  unsafe: "Only unsafe rows",
  violating: "Only violating rows",
  drive: "Only rows that drive",
  demand: "Only rows where it must drive",
  failing: "Only rows where it must drive and does not",
};
/** The rule type the rule picker offers for a row filter (require-drive for demand and failing). */
const ruleTypeFor = (only: Only | undefined) => (only === "demand" || only === "failing" ? "require-drive" : "inhibit");

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
  const [cond, setCond] = useState(columns.conditions[0]?.id ?? "");
  const [jump, setJump] = useState("");
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
  const condition = columns.conditions.find((c) => c.id === cond);

  function onAddCondition(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const state = new FormData(e.currentTarget).get("state");
    if (typeof state !== "string" || !cond) return;
    if (query.where.some((w) => w.cond === cond && w.state === state)) return;
    setQuery({ ...query, where: [...query.where, { cond, state }] });
  }

  function onJump(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const n = Number(jump);
    if (!/^[0-9]{1,10}$/.test(jump) || n >= totalRows) return;
    // Row N of the whole table: clear the filters, page to it, open it and scroll it into view.
    scrollTarget.current = n;
    setJumps((j) => j + 1);
    update((p) => {
      for (const k of ["only", "rule", "where"]) p.delete(k);
      p.set("from", String(Math.floor(n / PAGE) * PAGE));
      p.set("row", String(n));
    });
  }

  const last = Math.min(page.total, page.from + page.rows.length);
  const filtered = Boolean(query.only || query.where.length > 0);
  const jumpInvalid = jump !== "" && (!/^[0-9]{1,10}$/.test(jump) || Number(jump) >= totalRows);

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

      <Card className="mb-4 grid gap-3 md:grid-cols-2" role="group" aria-label="Row filters">
        <div>
          <label htmlFor="tt-only" className="block text-sm font-medium text-ink-700">
            Rows
          </label>
          <select
            id="tt-only"
            className={selectClass}
            value={query.only ?? ""}
            onChange={(e) => {
              const only = (e.target.value || undefined) as Only | undefined;
              // A rule of the other type does not go with the new choice.
              const keep = query.rule && columns.rules.some((r) => r.id === query.rule && r.type === ruleTypeFor(only));
              setQuery({ ...query, only, rule: keep ? query.rule : undefined });
            }}
          >
            <option value="">All rows</option>
            {ONLY.map((o) => (
              <option key={o} value={o}>
                {ONLY_LABELS[o]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="tt-rule" className="block text-sm font-medium text-ink-700">
            Rule (for unsafe / violating, or must-drive demand / failing)
          </label>
          <select
            id="tt-rule"
            className={selectClass}
            value={query.rule ?? ""}
            disabled={query.only === undefined || query.only === "drive"}
            onChange={(e) => setQuery({ ...query, rule: e.target.value || undefined })}
          >
            <option value="">{ruleTypeFor(query.only) === "inhibit" ? "Any inhibit rule" : "Any must-drive rule"}</option>
            {columns.rules
              .filter((r) => r.type === ruleTypeFor(query.only))
              .map((r) => (
                <option key={r.id} value={r.id}>
                  {r.id}: {r.label}
                </option>
              ))}
          </select>
        </div>
        <form onSubmit={onAddCondition} className="flex items-end gap-2" aria-label="Condition filter">
          <div className="min-w-0 flex-1">
            <label htmlFor="tt-cond" className="block text-sm font-medium text-ink-700">
              Condition
            </label>
            <select id="tt-cond" className={selectClass} value={cond} onChange={(e) => setCond(e.target.value)}>
              {columns.conditions.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.label}
                </option>
              ))}
            </select>
          </div>
          <div className="min-w-0 flex-1">
            <label htmlFor="tt-state" className="block text-sm font-medium text-ink-700">
              equals
            </label>
            <select id="tt-state" name="state" className={selectClass} key={cond}>
              {condition?.states.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </div>
          <Button type="submit" variant="secondary">
            Add
          </Button>
        </form>
        <form onSubmit={onJump} className="flex items-end gap-2" aria-label="Jump to row">
          <div className="min-w-0 flex-1">
            <label htmlFor="tt-jump" className="block text-sm font-medium text-ink-700">
              Jump to row
            </label>
            <input
              id="tt-jump"
              inputMode="numeric"
              value={jump}
              onChange={(e) => setJump(e.target.value.trim())}
              placeholder={`0 – ${(totalRows - 1).toLocaleString("en-US")}`}
              aria-invalid={jumpInvalid || undefined}
              aria-describedby={jumpInvalid ? "tt-jump-error" : undefined}
              className={`${selectClass} ${jumpInvalid ? "border-brick-600" : ""}`}
            />
          </div>
          <Button type="submit" variant="secondary">
            Go
          </Button>
        </form>
        {jumpInvalid ? (
          <p id="tt-jump-error" className="text-sm text-brick-700 md:col-span-2" role="alert">
            Enter a row number from 0 to {(totalRows - 1).toLocaleString("en-US")}.
          </p>
        ) : null}
      </Card>

      <div className="mb-2 flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <p aria-live="polite" data-testid="match-count">
            <strong>{page.total.toLocaleString("en-US")}</strong> of {totalRows.toLocaleString("en-US")} rows match
            {isLoading ? <span className="text-ink-500"> · loading…</span> : null}
          </p>
          {query.where.map((w) => (
            <Button
              key={`${w.cond}:${w.state}`}
              type="button"
              layout="tight"
              variant="token"
              size="pill"
              onClick={() => setQuery({ ...query, where: query.where.filter((x) => x !== w) })}
              aria-label={`Remove filter ${w.cond} = ${w.state}`}
            >
              {w.cond} = {w.state} <span aria-hidden="true">✕</span>
            </Button>
          ))}
          {query.only || query.rule || query.where.length > 0 ? (
            <Button type="button" variant="link" size="inline-strong" onClick={() => setQuery({ where: [] })}>
              Clear filters
            </Button>
          ) : null}
        </div>
        <a href={csvHref} className={buttonVariants({ variant: "secondary" })} download>
          Download CSV{query.only || query.where.length > 0 ? " (filtered)" : ""}
        </a>
      </div>

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

      <nav className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Pages">
        <p data-testid="page-label">
          <PageLabel rows={page.rows} total={page.total} totalRows={totalRows} from={page.from} last={last} filtered={filtered} />
        </p>
        <div className="flex gap-2">
          <Button
            type="button"
            variant="secondary"
            disabled={from === 0}
            onClick={() => update((p) => p.set("from", String(Math.max(0, from - PAGE))))}
          >
            Previous
          </Button>
          <Button
            type="button"
            variant="secondary"
            disabled={from + PAGE >= page.total}
            onClick={() => update((p) => p.set("from", String(from + PAGE)))}
          >
            Next
          </Button>
        </div>
      </nav>

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
