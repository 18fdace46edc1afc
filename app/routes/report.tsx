// The printable report of one revision (A4 or Letter through @page): cover with sign-offs, wiring
// diagram and list, conditions and contacts, rules and their results, single faults, the
// no-restart result, the truth-table summary, and the caution. The PDF route prints this page.
import { Link, useParams } from "react-router";
import type { Route } from "./+types/report";
import { requireRevisionPage } from "~/reviews/access.server";
import { getReview } from "~/reviews/reviews.server";
import { reportQuery } from "~/reviews/report-query.server";
import { compareWithLastApproved, labelsOf, loadRevision, tracesOf } from "~/reviews/revision-view.server";
import { readableSummary } from "~/reviews/readable.server";
import { currentDispositions, dispositionHistory } from "~/reviews/dispositions.server";
import { env } from "~/env.server";
import { tableColumns } from "~/reviews/truth-table.server";
import { tableRow } from "~/reviews/truth-table";
import { printedTablePages } from "~/reviews/print-bands";
import { csvApiPath, reviewPath } from "~/reviews/paths";
import { pageRows } from "~/engine";
import { paperDiagram } from "~/reviews/paper-diagram";
import { Logo } from "~/components/logo";
import { SectionError } from "~/components/error-boundary";
import { SIZES } from "~/components/report/paper";
import { ReportToolbar } from "~/components/report/toolbar";
import { ReportCover } from "~/components/report/cover";
import { ReportWiring } from "~/components/report/wiring";
import { ReportConditions, ReportRules } from "~/components/report/design-sections";
import { ReportChanges, ReportReading, type ReportDisposition } from "~/components/report/reading";
import { ReportComments } from "~/components/report/comments";
import { ReportTruthTable } from "~/components/report/truth-table";
import { ReportCaution } from "~/components/report/caution";

/** The full table is printed when it fits this many pages of the chosen paper (bands × pages of rows); else the CSV's URL. */
const TABLE_PAGE_LIMIT = 24;

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { member, design, ref } = await requireRevisionPage(context, params, "workspace.view");
  const loaded = await loadRevision(member.workspace.id, design.id, ref.number);
  const review = await getReview(member.workspace.id, ref.id);
  if (!loaded || !review) throw new Response("Not found", { status: 404 });
  const { size, compare } = await reportQuery(request, member.workspace.id, design.id, ref.number);
  const c = loaded.compiled;
  const columns = tableColumns(c);
  const tablePages = printedTablePages(columns, c.rows, size);
  const [history, comparison] = await Promise.all([
    dispositionHistory(member.workspace.id, ref.id, ref.contentHash),
    compareWithLastApproved(member.workspace.id, design.id, ref.number, c, loaded.verdict, compare),
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
    compare,
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

export default function Report({ loaderData }: Route.ComponentProps) {
  const d = loaderData;
  return (
    <div className="report bg-white text-ink-900">
      <style>{`@page { size: ${SIZES[d.size]}; margin: 14mm 12mm; }
@media print { .report-toolbar { display: none !important; } body { background: white; } .report-page { padding: 0 !important; max-width: none !important; } .break-before { break-before: page; } }
.report table { border-collapse: collapse; }
.report th, .report td { vertical-align: top; }`}</style>
      <ReportToolbar slug={d.slug} designId={d.design.id} number={d.revision.number} size={d.size} compare={d.compare} />

      <main className="report-page mx-auto max-w-[190mm] px-6 py-8 text-sm leading-snug">
        <ReportCover
          workspaceName={d.workspaceName}
          design={d.design}
          revision={d.revision}
          status={d.status}
          verdictOk={d.verdict.ok}
          refused={d.refused}
          decisions={d.decisions}
          generatedAt={d.generatedAt}
        />
        <ReportWiring design={d.document} diagram={d.diagram} wiring={d.wiring} nets={d.nets} />
        <ReportConditions doc={d.document} />
        <ReportRules doc={d.document} verdict={d.verdict} labels={d.labels} traces={d.traces} />
        <ReportReading readable={d.readable} dispositions={d.dispositions} />
        <ReportChanges comparison={d.comparison} conditions={d.readable.conditions} number={d.revision.number} />
        <ReportComments comments={d.comments} />
        <ReportTruthTable
          rows={d.rows}
          verdict={d.verdict}
          columns={d.columns}
          table={d.table}
          tablePages={d.tablePages}
          pageLimit={TABLE_PAGE_LIMIT}
          paper={SIZES[d.size]}
          csvUrl={d.csvUrl}
        />
        <ReportCaution className="mt-8" />
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
