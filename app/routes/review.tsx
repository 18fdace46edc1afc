// The review of one revision: verdict, changes since the last approved revision, comments (on the
// revision, a truth-table row or a component), the request for review and the decision.
import { Link, data, redirect, useActionData } from "react-router";
import type { Route } from "./+types/review";
import { can, type Action } from "~/lib/roles";
import { fieldErrors, type FieldErrors } from "~/lib/forms";
import { requireRevisionPage } from "~/reviews/access.server";
import { compiledRevision, revisionRef } from "~/reviews/compiled.server";
import { addComment, decide, getReview, listReviewers, requestReview, reviewStatusOf } from "~/reviews/reviews.server";
import { compareWithLastApproved, labelsOf, loadRevision, tracesOf } from "~/reviews/revision-view.server";
import { commentSchema, decisionSchema, requestReviewSchema, reviewFormObject, reviewQuerySchema } from "~/reviews/forms";
import { VERDICT_LABELS } from "~/reviews/status";
import { reportPath, reviewPath, truthTablePath } from "~/reviews/paths";
import { designPath, editorPath } from "~/designs/paths";
import { HashPrefix, Section, When } from "~/designs/design-bits";
import { PageHeader } from "~/components/page-header";
import { SafetyNote } from "~/components/safety-note";
import { Notice } from "~/components/ui/form";
import { buttonVariants } from "~/components/ui/button";
import { ButtonLink } from "~/components/ui/link";
import { cardVariants } from "~/components/ui/card";
import { VerdictSummary } from "~/components/truth-table/verdict-summary";
import { RefusedNotice } from "~/components/refused-mark";
import { ReviewStatusBadge } from "~/components/truth-table/review-status";
import { readableSummary } from "~/reviews/readable.server";
import { currentDispositions, dispositionHistory, recordDisposition } from "~/reviews/dispositions.server";
import { dispositionSchema } from "~/reviews/dispositions";
import { ReadableSummary, type DispositionView } from "~/components/review/readable-summary";
import { ChangesView } from "~/components/review/changes-view";
import { CommentForm, CommentsView, type ActionResult } from "~/components/review/comments";
import { DecisionForm, DecisionsView, RequestForm, RequestsView } from "~/components/review/decisions";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { member, design, ref } = await requireRevisionPage(context, params, "workspace.view");
  // A bad value is not a comparison: the page falls back to the default one (the report, which prints it, says 400).
  const query = reviewQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  const { compare = null, revision: chosen } = query.success ? query.data : {};
  // The chooser names both revisions: another revision to review is that revision's page.
  if (chosen !== undefined && chosen !== ref.number && (await revisionRef(member.workspace.id, design.id, chosen))) {
    throw redirect(`${reviewPath(member.workspace.slug, design.id, chosen)}${compare && compare !== chosen ? `?compare=${compare}` : ""}`);
  }
  const loaded = await loadRevision(member.workspace.id, design.id, ref.number);
  const review = await getReview(member.workspace.id, ref.id);
  if (!loaded || !review) throw new Response("Not found", { status: 404 });
  const [reviewers, comparison, statuses, history] = await Promise.all([
    listReviewers(member.workspace.id),
    compareWithLastApproved(member.workspace.id, design.id, ref.number, loaded.compiled, loaded.verdict, compare),
    reviewStatusOf(member.workspace.id, [design.id]),
    dispositionHistory(member.workspace.id, ref.id, ref.contentHash),
  ]);
  const dispositions: Record<string, DispositionView> = {};
  for (const [key, d] of currentDispositions(history)) {
    dispositions[key] = {
      component: d.component,
      mode: d.mode,
      disposition: d.disposition,
      justification: d.justification,
      authorName: d.authorName,
      createdAt: d.createdAt.toISOString(),
    };
  }
  const latestNumber = statuses.get(design.id)?.latest?.number ?? ref.number;
  const otherNumbers = [...(statuses.get(design.id)?.byNumber.keys() ?? [])].filter((x) => x !== ref.number).sort((a, b) => b - a);
  const iso = (d: Date) => d.toISOString();
  return {
    slug: member.workspace.slug,
    me: { id: member.user.id, role: member.role },
    design: { id: design.id, name: design.name, vehicleName: design.vehicleName },
    revision: {
      number: ref.number,
      contentHash: ref.contentHash,
      message: loaded.rev.message,
      authorId: loaded.rev.authorId,
      authorName: loaded.rev.authorName,
      createdAt: iso(loaded.rev.createdAt),
      rows: loaded.compiled.rows,
      latestNumber,
    },
    verdict: loaded.verdict,
    refused: loaded.refused,
    labels: labelsOf(loaded.design),
    traces: tracesOf(loaded.compiled, loaded.verdict),
    components: loaded.design.components.map((c) => ({ id: c.id, label: ("label" in c && c.label) || c.id, type: c.type })),
    comparison,
    otherNumbers,
    readable: readableSummary(ref.id, loaded.compiled, loaded.verdict),
    dispositions,
    status: review.status,
    requests: review.requests.map((r) => ({ ...r, requestedAt: iso(r.requestedAt) })),
    decisions: review.decisions.map((d) => ({ ...d, decidedAt: iso(d.decidedAt) })),
    comments: review.comments.map((c) => ({ ...c, createdAt: iso(c.createdAt) })),
    reviewers: reviewers.filter((r) => r.id !== loaded.rev.authorId),
    can: {
      request: can(member.role, "design.edit"),
      decide: can(member.role, "review.decide") && member.user.id !== loaded.rev.authorId,
      dispose: can(member.role, "fault.dispose"),
      comment: true,
    },
    authored: member.user.id === loaded.rev.authorId,
  };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const form = reviewFormObject(await request.formData());
  const intent = String(form.intent ?? "");
  const needs: Action =
    intent === "request"
      ? "design.edit"
      : intent === "decide"
        ? "review.decide"
        : intent === "dispose"
          ? "fault.dispose"
          : "workspace.view";
  // The role is checked first (requireCan inside), so a technician's forged decision is 403 whatever the body says.
  const { member, ref } = await requireRevisionPage(context, params, needs);
  const fault = intent === "dispose" ? `${String(form.component ?? "")}/${String(form.mode ?? "")}` : undefined;
  const fail = (status: number, errors: FieldErrors) => data<ActionResult>({ intent, ok: false, errors, fault }, { status });
  if (intent === "request") {
    const parsed = requestReviewSchema.safeParse(form);
    if (!parsed.success) return fail(400, fieldErrors(parsed.error));
    const out = await requestReview(member, ref.id, { reviewerIds: parsed.data.reviewers, note: parsed.data.note });
    if (!out.ok) return fail(out.status, out.fields);
    return { intent, ok: true, message: "Review requested; each reviewer got an e-mail." } satisfies ActionResult;
  }
  if (intent === "comment") {
    const parsed = commentSchema.safeParse(form);
    if (!parsed.success) return fail(400, fieldErrors(parsed.error));
    const out = await addComment(member, ref.id, await compiledRevision(member.workspace.id, ref), parsed.data);
    if (!out.ok) return fail(out.status, out.fields);
    return { intent, ok: true, message: "Comment added." } satisfies ActionResult;
  }
  if (intent === "dispose") {
    const parsed = dispositionSchema.safeParse(form);
    if (!parsed.success) return fail(400, placeFault(fieldErrors(parsed.error)));
    const out = await recordDisposition(member, ref.id, parsed.data);
    if (!out.ok) return fail(out.status, placeFault(out.fields));
    return {
      intent,
      ok: true,
      message: `Disposition recorded for ${parsed.data.component} ${parsed.data.mode.replace("-", " ")}.`,
    } satisfies ActionResult;
  }
  if (intent === "decide") {
    const parsed = decisionSchema.safeParse(form);
    if (!parsed.success) return fail(400, fieldErrors(parsed.error));
    const out = await decide(member, ref.id, { verdict: parsed.data.verdict, comment: parsed.data.comment });
    if (!out.ok) return fail(out.status, out.fields);
    return { intent, ok: true, message: `${VERDICT_LABELS[parsed.data.verdict]}; the author got an e-mail.` } satisfies ActionResult;
  }
  // Above the page: no form of it has an intent control to mark.
  return fail(400, { intent: "Unknown action.", form: "Unknown action." });
}

/**
 * A disposition's contact and fault mode are the hidden fields of one listed fault's form, so a fault
 * the page does not list has no form to show their error beside: it goes above the page as well.
 */
function placeFault(errors: FieldErrors): FieldErrors {
  const problem = errors.component ? `Contact of the fault: ${errors.component}` : errors.mode ? `Fault mode: ${errors.mode}` : null;
  return problem && !errors.form ? { ...errors, form: problem } : errors;
}

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Review · ${data?.design.name ?? "Design"} r${data?.revision.number ?? ""} · Chainproof` },
];

export default function Review({ loaderData }: Route.ComponentProps) {
  const { slug, design, revision, verdict, labels, traces, comparison, status, requests, decisions, comments, can, authored } = loaderData;
  const result = useActionData<typeof action>() as ActionResult | undefined;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={designPath(slug, design.id)} className="text-copper-700 underline">
          {design.name}
        </Link>
        {design.vehicleName ? <span className="text-ink-500"> · {design.vehicleName}</span> : null}
      </p>
      <PageHeader
        title={`Review of revision ${revision.number}`}
        description={
          <span className="inline-flex flex-wrap items-center gap-2">
            <ReviewStatusBadge status={status} /> Saved by {revision.authorName}, <When iso={revision.createdAt} /> ·{" "}
            <HashPrefix hash={revision.contentHash} />
          </span>
        }
        actions={
          <>
            <ButtonLink to={truthTablePath(slug, design.id, revision.number)} variant="secondary">
              Truth table
            </ButtonLink>
            <a
              href={reportPath(
                slug,
                design.id,
                revision.number,
                undefined,
                comparison.baseline?.chosen ? comparison.baseline.number : null,
              )}
              className={buttonVariants({ variant: "secondary" })}
            >
              Report
            </a>
            <ButtonLink to={editorPath(slug, design.id, revision.number)} variant="secondary">
              Canvas
            </ButtonLink>
          </>
        }
      />
      {loaderData.refused ? <RefusedNotice reasons={loaderData.refused} className="mb-4" /> : null}
      {revision.latestNumber > revision.number ? (
        <div className="mb-4">
          <Notice tone="warning">
            Revision {revision.latestNumber} is newer.{" "}
            <Link to={reviewPath(slug, design.id, revision.latestNumber)} className="font-semibold underline">
              Review revision {revision.latestNumber}
            </Link>
            ; a decision here applies to revision {revision.number} only.
          </Notice>
        </div>
      ) : null}
      {result?.ok && result.message ? (
        <div className="mb-4">
          <Notice tone="success">{result.message}</Notice>
        </div>
      ) : null}
      {result && !result.ok && result.errors?.form ? (
        <div className="mb-4">
          <Notice tone="error">{result.errors.form}</Notice>
        </div>
      ) : null}

      <div className="grid grid-cols-1 gap-5 lg:grid-cols-3">
        <div className="min-w-0 space-y-5 lg:col-span-2">
          {revision.message ? (
            <p className={cardVariants({ padding: "snug", className: "text-sm [overflow-wrap:anywhere]" })}>
              <span className="text-ink-500">Revision message:</span> “{revision.message}”
            </p>
          ) : null}
          <ReadableSummary
            readable={loaderData.readable}
            table={truthTablePath(slug, design.id, revision.number)}
            ruleLabels={labels.rules}
            dispositions={loaderData.dispositions}
            canDispose={can.dispose}
            dispositionErrors={
              result && !result.ok && result.intent === "dispose" && result.fault
                ? { key: result.fault, errors: result.errors ?? {} }
                : null
            }
          />
          <Section title="Verdict">
            <VerdictSummary verdict={verdict} ruleLabels={labels.rules} componentLabels={labels.components} traces={traces} />
          </Section>
          <Section title="Changes">
            <ChangesView
              comparison={comparison}
              number={revision.number}
              others={loaderData.otherNumbers}
              conditions={loaderData.readable.conditions}
              table={truthTablePath(slug, design.id, revision.number)}
            />
          </Section>
          <Section title={`Comments (${comments.length})`}>
            <CommentsView
              comments={comments}
              slug={slug}
              designId={design.id}
              number={revision.number}
              labels={labels.components}
              conditionOrder={loaderData.readable.conditions.map((c) => c.id)}
            />
            <CommentForm key={`comment-form-${comments.length}`} result={result} components={loaderData.components} rows={revision.rows} />
          </Section>
        </div>
        <div className="min-w-0 space-y-5">
          <Section title="Decision">
            <DecisionsView decisions={decisions} />
            {can.decide ? (
              <DecisionForm result={result} />
            ) : (
              <p className="mt-3 text-sm text-ink-600">
                {authored
                  ? "You authored this revision, so another reviewer decides on it."
                  : "Only workspace members with the reviewer role approve a revision or request changes."}
              </p>
            )}
          </Section>
          <Section title="Reviewers asked">
            <RequestsView requests={requests} />
            {can.request ? <RequestForm result={result} reviewers={loaderData.reviewers} /> : null}
          </Section>
          <SafetyNote />
        </div>
      </div>
    </>
  );
}
