// The printable report of one revision (A4 or Letter through @page): cover with sign-offs, wiring
// diagram and list, conditions and contacts, rules and their results, single faults, the
// no-restart result, the truth-table summary, and the caution. The PDF route prints this page.
import { Link, useParams } from "react-router";
import type { Route } from "./+types/report";
import { RefusedNotice } from "~/components/refused-mark";
import { REFUSED_MARK } from "~/designs/standing-words";
import { requireRevisionPage } from "~/reviews/access.server";
import { getReview } from "~/reviews/reviews.server";
import { compareWithLastApproved, labelsOf, loadRevision, tracesOf } from "~/reviews/revision-view.server";
import { readableSummary } from "~/reviews/readable.server";
import { currentDispositions, dispositionHistory } from "~/reviews/dispositions.server";
import { ReportChanges, ReportReading, type ReportDisposition } from "~/components/review/report-sections";
import { env } from "~/env.server";
import { tableColumns } from "~/reviews/truth-table.server";
import { tableRow } from "~/reviews/truth-table";
import { printBands } from "~/reviews/print-bands";
import { REVIEW_STATUS_LABELS, VERDICT_LABELS } from "~/reviews/status";
import { csvApiPath, reportPath, reportPdfPath, reviewPath } from "~/reviews/paths";
import { pageRows, type Design, type Predicate } from "~/engine";
import { SAFETY_TEXT } from "~/components/safety-note";
import { VerdictSummary } from "~/components/truth-table/verdict-summary";
import { TruthTableBands } from "~/components/truth-table/print-bands";
import { WiringDiagram } from "~/components/wiring-diagram";
import { paperDiagram } from "~/reviews/paper-diagram";
import { Logo } from "~/components/logo";
import { SectionError } from "~/components/error-boundary";

/** The full table is printed when it fits this many A4 pages (bands × pages of rows); else the CSV's URL. */
const TABLE_PAGE_LIMIT = 24;
/** Rows of the dense printed table on one A4 page (9 px type, 14 mm margins). */
const ROWS_PER_PAGE = 80;
const SIZES = { a4: "A4", letter: "Letter" } as const;
type Size = keyof typeof SIZES;

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { member, design, ref } = await requireRevisionPage(context, params, "workspace.view");
  const loaded = await loadRevision(member.workspace.id, design.id, ref.number);
  const review = await getReview(member.workspace.id, ref.id);
  if (!loaded || !review) throw new Response("Not found", { status: 404 });
  const sizeParam = new URL(request.url).searchParams.get("size");
  const size: Size = sizeParam === "letter" ? "letter" : "a4";
  const c = loaded.compiled;
  const columns = tableColumns(c);
  const tablePages = printBands(columns, c.rows).length * Math.ceil(c.rows / ROWS_PER_PAGE);
  const [history, comparison] = await Promise.all([
    dispositionHistory(member.workspace.id, ref.id, ref.contentHash),
    compareWithLastApproved(member.workspace.id, design.id, ref.number, c, loaded.verdict),
  ]);
  const dispositions: Record<string, ReportDisposition> = {};
  for (const [key, x] of currentDispositions(history)) {
    dispositions[key] = {
      disposition: x.disposition,
      justification: x.justification,
      authorName: x.authorName,
      createdAt: x.createdAt.toISOString(),
    };
  }
  const wiring = loaded.design.wires.map((w) => ({ from: w.from, to: w.to, net: c.terminalNet[w.from] ?? -1 }));
  return {
    size,
    slug: member.workspace.slug,
    workspaceName: member.workspace.name,
    design: { id: design.id, name: design.name, vehicleName: design.vehicleName },
    revision: {
      number: ref.number,
      contentHash: ref.contentHash,
      message: loaded.rev.message,
      authorName: loaded.rev.authorName,
      createdAt: loaded.rev.createdAt.toISOString(),
    },
    document: loaded.design,
    verdict: loaded.verdict,
    refused: loaded.refused,
    labels: labelsOf(loaded.design),
    traces: tracesOf(c, loaded.verdict),
    status: review.status,
    decisions: review.decisions.map((d) => ({
      id: d.id,
      reviewerName: d.reviewerName,
      verdict: d.verdict,
      comment: d.comment,
      contentHash: d.contentHash,
      decidedAt: d.decidedAt.toISOString(),
    })),
    wiring,
    diagram: paperDiagram(loaded.design, size),
    nets: c.nets,
    columns,
    table: tablePages <= TABLE_PAGE_LIMIT ? pageRows(c, { from: 0, count: c.rows }).rows.map((v) => tableRow(columns, v)) : null,
    tablePages,
    csvUrl: new URL(csvApiPath(design.id, ref.number), env.APP_URL).toString(),
    readable: readableSummary(ref.id, c, loaded.verdict),
    dispositions,
    comparison,
    comments: review.comments.map((x) => ({
      id: x.id,
      authorName: x.authorName,
      body: x.body,
      anchor: x.anchor,
      rowIndex: x.rowIndex,
      componentId: x.componentId,
      createdAt: x.createdAt.toISOString(),
    })),
    rows: c.rows,
    generatedAt: new Date().toISOString(),
  };
}

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Report · ${data?.design.name ?? "Design"} r${data?.revision.number ?? ""} · Chainproof` },
];

function predicateText(p: Predicate): string {
  if ("cond" in p) return `${p.cond} is ${p.in.join(" or ")}`;
  if ("all" in p) return p.all.length === 0 ? "always" : p.all.map((x) => `(${predicateText(x)})`).join(" and ");
  if ("any" in p) return p.any.length === 0 ? "never" : p.any.map((x) => `(${predicateText(x)})`).join(" or ");
  if ("not" in p) return `not (${predicateText(p.not)})`;
  return "always";
}

function ruleText(r: Design["rules"][number]): string {
  if (r.type === "no-restart") return "The drive never comes on while the throttle was already held (any sequence of steps from power-up).";
  if (r.type === "require-drive") return `When ${predicateText(r.when)}: the drive must be on.`;
  const forbid = r.forbid === "drive" ? "the drive" : `input ${r.forbid.energized} energized`;
  return `When ${predicateText(r.when)}: no ${forbid}.`;
}

const iso = (s: string) => `${s.slice(0, 10)} ${s.slice(11, 16)} UTC`;
const h2 = "mt-8 break-after-avoid border-b-2 border-ink-800 pb-1 text-lg font-semibold";

export default function Report({ loaderData }: Route.ComponentProps) {
  const d = loaderData;
  const doc = d.document;
  const approvals = d.decisions.filter((x) => x.verdict === "approved");
  return (
    <div className="report bg-white text-ink-900">
      <style>{`@page { size: ${SIZES[d.size]}; margin: 14mm 12mm; }
@media print { .report-toolbar { display: none !important; } body { background: white; } .report-page { padding: 0 !important; max-width: none !important; } .break-before { break-before: page; } }
.report table { border-collapse: collapse; }
.report th, .report td { vertical-align: top; }`}</style>
      <div className="report-toolbar sticky top-0 z-10 flex flex-wrap items-center gap-3 border-b border-ink-200 bg-ink-50 px-4 py-2 text-sm">
        <Link to={reviewPath(d.slug, d.design.id, d.revision.number)} className="font-semibold text-copper-700 underline">
          Back to the review
        </Link>
        <span className="text-ink-500">Paper:</span>
        {(Object.keys(SIZES) as Size[]).map((s) =>
          s === d.size ? (
            <strong key={s} aria-current="true">
              {SIZES[s]}
            </strong>
          ) : (
            <Link key={s} to={reportPath(d.slug, d.design.id, d.revision.number, s)} className="text-copper-700 underline">
              {SIZES[s]}
            </Link>
          ),
        )}
        <a
          href={reportPdfPath(d.slug, d.design.id, d.revision.number, d.size)}
          className="ml-auto rounded-md bg-copper-600 px-3 py-1.5 font-semibold text-white"
        >
          Download PDF ({SIZES[d.size]})
        </a>
      </div>

      <main className="report-page mx-auto max-w-[190mm] px-6 py-8 text-sm leading-snug">
        {/* Cover */}
        <section aria-label="Cover" data-testid="report-cover">
          <div className="flex items-center justify-between">
            <Logo />
            <span className="text-xs text-ink-500">{d.workspaceName}</span>
          </div>
          <h1 className="mt-10 text-3xl font-semibold tracking-tight">{d.design.name}</h1>
          <p className="mt-1 text-lg text-ink-700">Drive-inhibit design report, revision {d.revision.number}</p>
          <dl className="mt-8 grid grid-cols-[10rem_1fr] gap-x-4 gap-y-2">
            <dt className="text-ink-500">Vehicle</dt>
            <dd>{d.design.vehicleName ?? "No vehicle"}</dd>
            <dt className="text-ink-500">Design</dt>
            <dd>{d.design.name}</dd>
            <dt className="text-ink-500">Revision</dt>
            <dd className="[overflow-wrap:anywhere]">
              {d.revision.number}, saved by {d.revision.authorName} on {iso(d.revision.createdAt)}
              {d.revision.message ? ` — “${d.revision.message}”` : ""}
            </dd>
            <dt className="text-ink-500">Content hash</dt>
            <dd className="break-all font-mono text-xs">SHA-256 {d.revision.contentHash}</dd>
            <dt className="text-ink-500">Review status</dt>
            <dd className="font-semibold" data-testid="report-status">
              {REVIEW_STATUS_LABELS[d.status]}
            </dd>
            <dt className="text-ink-500">Verdict</dt>
            <dd>{d.refused ? REFUSED_MARK : d.verdict.ok ? "Every rule holds" : "Some rules fail"}</dd>
          </dl>
          {d.refused ? <RefusedNotice reasons={d.refused} className="mt-4 break-inside-avoid" /> : null}
          <h2 className={h2}>Sign-offs</h2>
          {d.decisions.length === 0 ? (
            <p className="mt-2 text-ink-600">No reviewer has decided on this revision.</p>
          ) : (
            <table className="mt-2 w-full text-left" data-testid="signoffs">
              <thead className="text-xs uppercase text-ink-500">
                <tr>
                  <th className="py-1 pr-2">Reviewer</th>
                  <th className="py-1 pr-2">Decision</th>
                  <th className="py-1 pr-2">When</th>
                  <th className="py-1 pr-2">Content hash signed</th>
                  <th className="py-1">Comment</th>
                </tr>
              </thead>
              <tbody>
                {d.decisions.map((x) => (
                  <tr key={x.id} className="border-t border-ink-200" data-testid="signoff">
                    <td className="py-1 pr-2 font-medium">{x.reviewerName}</td>
                    <td className="py-1 pr-2">
                      {x.verdict === "approved" ? "✓ " : "✕ "}
                      {VERDICT_LABELS[x.verdict]}
                    </td>
                    <td className="whitespace-nowrap py-1 pr-2">{iso(x.decidedAt)}</td>
                    <td className="py-1 pr-2 font-mono text-xs">{x.contentHash.slice(0, 16)}…</td>
                    <td className="py-1">{x.comment}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          {approvals.length === 0 ? <p className="mt-2 font-semibold">This revision is not approved.</p> : null}
          <aside className="mt-6 border-l-4 border-copper-500 bg-copper-50 px-3 py-2 text-copper-700" aria-label="Safety caution">
            <strong>Caution.</strong> {SAFETY_TEXT}
          </aside>
          <p className="mt-4 text-xs text-ink-500">Generated {iso(d.generatedAt)} by Chainproof.</p>
        </section>

        <section className="break-before" aria-label="Wiring">
          <h2 className={h2}>Wiring diagram</h2>
          {d.diagram ? (
            <div className="break-inside-avoid" data-testid="report-diagram" data-layout={d.diagram.layout}>
              <div className="mx-auto mt-3 w-fit rounded border border-ink-200 p-2">
                <div style={{ width: d.diagram.widthPx }}>
                  <WiringDiagram design={doc} layout={d.diagram.layout} />
                </div>
              </div>
              <p className="mt-1 text-xs text-ink-600">
                Smallest type {d.diagram.smallestPt.toFixed(1)} pt
                {d.diagram.layout === "stacked" ? "; drawn in one column, in order of wire hops from the supply, to fit the page" : ""}.
                Labels longer than 22 characters are shortened here; the tables below give them in full.
              </p>
            </div>
          ) : (
            <p className="mt-2" data-testid="diagram-left-out">
              The diagram is left out: fitted to one page, wide or in one column, its labels would print smaller than 6 pt. The wiring list
              below gives every wire, terminal to terminal, with its net.
            </p>
          )}
          <h2 className={h2}>Wiring list</h2>
          <table className="mt-2 w-full text-left" data-testid="wiring-list">
            <thead className="text-xs uppercase text-ink-500">
              <tr>
                <th className="py-1 pr-2">#</th>
                <th className="py-1 pr-2">From terminal</th>
                <th className="py-1 pr-2">To terminal</th>
                <th className="py-1">Net</th>
              </tr>
            </thead>
            <tbody className="font-mono text-xs">
              {d.wiring.map((w, i) => (
                <tr key={i} className="border-t border-ink-100">
                  <td className="py-0.5 pr-2">{i + 1}</td>
                  <td className="py-0.5 pr-2">{w.from}</td>
                  <td className="py-0.5 pr-2">{w.to}</td>
                  <td className="py-0.5">
                    N{w.net} <span className="text-ink-500">({d.nets[w.net]?.join(", ")})</span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>

        <section aria-label="Conditions and contacts">
          <h2 className={h2}>Conditions and contacts</h2>
          <table className="mt-2 w-full text-left">
            <thead className="text-xs uppercase text-ink-500">
              <tr>
                <th className="py-1 pr-2">Condition</th>
                <th className="py-1 pr-2">States</th>
                <th className="py-1">Contacts (closed in; part)</th>
              </tr>
            </thead>
            <tbody>
              {doc.conditions.map((cond) => (
                <tr key={cond.id} className="border-t border-ink-200">
                  <td className="py-1 pr-2">
                    {cond.label || cond.id} <code className="text-xs text-ink-500">{cond.id}</code>
                  </td>
                  <td className="py-1 pr-2">{cond.states.join(", ")}</td>
                  <td className="py-1">
                    {doc.components
                      .filter((k) => k.type === "contact" && k.condition === cond.id)
                      .map((k) =>
                        k.type === "contact" ? (
                          <div key={k.id}>
                            <strong>{k.id}</strong> {k.label && k.label !== k.id ? `${k.label} ` : ""}— closed in {k.closedIn.join(", ")}
                            {k.part ? `; part ${k.part}` : ""}
                          </div>
                        ) : null,
                      )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-2 text-xs text-ink-600">
            Controller: throttle on {doc.controller.throttle.condition} (released: {doc.controller.throttle.released.join(", ") || "—"};
            applied: {doc.controller.throttle.applied.join(", ") || "—"}; fault: {(doc.controller.throttle.fault ?? []).join(", ") || "—"});
            brake {doc.controller.brakeCutsDrive === false ? "does not cut" : "cuts"} the drive; lockouts:{" "}
            {(doc.controller.lockouts ?? []).join(", ") || "none"}.
          </p>
        </section>

        <section aria-label="Rules and results">
          <h2 className={h2}>Rules</h2>
          <ul className="mt-2 space-y-1">
            {doc.rules.map((r) => (
              <li key={r.id}>
                <strong>{r.id}</strong> {r.label ? `${r.label}: ` : ""}
                {ruleText(r)}
              </li>
            ))}
          </ul>
          <h2 className={h2}>Results, single faults and no restart</h2>
          <div className="mt-2">
            <VerdictSummary verdict={d.verdict} ruleLabels={d.labels.rules} componentLabels={d.labels.components} traces={d.traces} />
          </div>
        </section>

        <ReportReading readable={d.readable} dispositions={d.dispositions} />
        <ReportChanges comparison={d.comparison} conditions={d.readable.conditions} number={d.revision.number} />
        <section aria-label="Review comments" data-testid="report-comments">
          <h2 className={h2}>Review comments</h2>
          {d.comments.length === 0 ? (
            <p className="mt-2">No comments.</p>
          ) : (
            <ul className="mt-2 space-y-2">
              {d.comments.map((x) => (
                <li key={x.id} className="break-inside-avoid">
                  <p className="text-xs text-ink-500">
                    {x.authorName}, {iso(x.createdAt)}
                    {x.anchor === "row" && x.rowIndex !== null ? ` · on row ${x.rowIndex}` : ""}
                    {x.anchor === "component" && x.componentId ? ` · on component ${x.componentId}` : ""}
                  </p>
                  <p className="whitespace-pre-wrap">{x.body}</p>
                </li>
              ))}
            </ul>
          )}
        </section>

        <section aria-label="Truth table">
          <h2 className={h2}>Truth table</h2>
          <p className="mt-2">
            {d.rows.toLocaleString("en-US")} rows; the drive is on in {d.verdict.driveRows.toLocaleString("en-US")}.{" "}
            {d.verdict.rules
              .filter((r) => "unsafeRows" in r)
              .map((r) => ("unsafeRows" in r ? `${r.id}: ${r.unsafeRows} unsafe, ${r.violatingRows} violating` : ""))
              .join("; ")}
          </p>
          {d.table ? (
            <TruthTableBands columns={d.columns} rows={d.table} />
          ) : (
            <p className="mt-2">
              The full table is not printed: it would take about {d.tablePages.toLocaleString("en-US")} pages, more than {TABLE_PAGE_LIMIT}.
              The groups above describe every row; the whole table is the CSV at{" "}
              <a href={d.csvUrl} className="break-all text-copper-700 underline" data-testid="report-csv-url">
                {d.csvUrl}
              </a>{" "}
              (members of the workspace, signed in).
            </p>
          )}
        </section>

        <aside className="mt-8 border-l-4 border-copper-500 bg-copper-50 px-3 py-2 text-copper-700" aria-label="Safety caution">
          <strong>Caution.</strong> {SAFETY_TEXT}
        </aside>
      </main>
    </div>
  );
}

/** The report is paper, outside the shell: its error keeps the logo and leads back to the review. */
export function ErrorBoundary() {
  const { ws, designId, number } = useParams();
  return (
    <main className="mx-auto max-w-3xl px-6 py-8">
      <Logo />
      <SectionError
        back={
          ws && designId && number && /^[1-9][0-9]{0,8}$/.test(number) ? (
            <Link to={reviewPath(ws, designId, Number(number))} className="font-semibold text-action-ink underline">
              Back to the review
            </Link>
          ) : null
        }
      />
    </main>
  );
}
