// The report's cover: what was reviewed (vehicle, design, revision, content hash), its review status
// and verdict, the sign-offs with the content hash each signed, and the caution.
import { RefusedNotice } from "~/components/refused-mark";
import { Logo } from "~/components/logo";
import { REFUSED_MARK } from "~/designs/standing-words";
import { REVIEW_STATUS_LABELS, VERDICT_LABELS, type ReviewStatus, type ReviewVerdict } from "~/reviews/status";
import { Table, TBody, Td } from "~/components/ui/table";
import { PaperHead } from "./paper-head";
import { ReportCaution } from "./caution";
import { h2, iso } from "./paper";

export type ReportSignoff = {
  id: string;
  reviewerName: string;
  verdict: ReviewVerdict;
  comment: string;
  contentHash: string;
  decidedAt: string;
};

export function ReportCover({
  workspaceName,
  design,
  revision,
  status,
  verdictOk,
  refused,
  decisions,
  generatedAt,
}: {
  workspaceName: string;
  design: { name: string; vehicleName: string | null };
  revision: { number: number; contentHash: string; message: string; authorName: string; createdAt: string };
  status: ReviewStatus;
  verdictOk: boolean;
  /** Why the revision is refused, or null. */
  refused: readonly string[] | null;
  decisions: ReportSignoff[];
  generatedAt: string;
}) {
  const approvals = decisions.filter((x) => x.verdict === "approved");
  return (
    <section aria-label="Cover" data-testid="report-cover">
      <div className="flex items-center justify-between">
        <Logo />
        <span className="text-xs text-ink-500">{workspaceName}</span>
      </div>
      <h1 className="mt-10 text-3xl font-semibold tracking-tight">{design.name}</h1>
      <p className="mt-1 text-lg text-ink-700">Drive-inhibit design report, revision {revision.number}</p>
      <dl className="mt-8 grid grid-cols-[10rem_1fr] gap-x-4 gap-y-2">
        <dt className="text-ink-500">Vehicle</dt>
        <dd>{design.vehicleName ?? "No vehicle"}</dd>
        <dt className="text-ink-500">Design</dt>
        <dd>{design.name}</dd>
        <dt className="text-ink-500">Revision</dt>
        <dd className="[overflow-wrap:anywhere]">
          {revision.number}, saved by {revision.authorName} on {iso(revision.createdAt)}
          {revision.message ? ` — “${revision.message}”` : ""}
        </dd>
        <dt className="text-ink-500">Content hash</dt>
        <dd className="break-all font-mono text-xs">SHA-256 {revision.contentHash}</dd>
        <dt className="text-ink-500">Review status</dt>
        <dd className="font-semibold" data-testid="report-status">
          {REVIEW_STATUS_LABELS[status]}
        </dd>
        <dt className="text-ink-500">Verdict</dt>
        <dd>{refused ? REFUSED_MARK : verdictOk ? "Every rule holds" : "Some rules fail"}</dd>
      </dl>
      {refused ? <RefusedNotice reasons={refused} className="mt-4 break-inside-avoid" /> : null}
      <h2 className={h2}>Sign-offs</h2>
      {decisions.length === 0 ? (
        <p className="mt-2 text-ink-600">No reviewer has decided on this revision.</p>
      ) : (
        <Table look="paper" className="mt-2 w-full" data-testid="signoffs">
          <PaperHead columns={["Reviewer", "Decision", "When", "Content hash signed", "Comment"]} />
          <TBody divided={false}>
            {decisions.map((x) => (
              <tr key={x.id} className="border-t border-ink-200" data-testid="signoff">
                <Td pad="paper" className="font-medium">
                  {x.reviewerName}
                </Td>
                <Td pad="paper">
                  {x.verdict === "approved" ? "✓ " : "✕ "}
                  {VERDICT_LABELS[x.verdict]}
                </Td>
                <Td pad="paper" className="whitespace-nowrap">
                  {iso(x.decidedAt)}
                </Td>
                <Td pad="paper" className="font-mono text-xs">
                  {x.contentHash.slice(0, 16)}…
                </Td>
                <Td pad="paper">{x.comment}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
      {approvals.length === 0 ? <p className="mt-2 font-semibold">This revision is not approved.</p> : null}
      <ReportCaution className="mt-6" />
      <p className="mt-4 text-xs text-ink-500">Generated {iso(generatedAt)} by Chainproof.</p>
    </section>
  );
}
