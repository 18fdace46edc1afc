// The review's decision side: the decisions taken (with the content hash each signed), the form
// that approves or requests changes, the reviewers asked and the form that asks them for a review.
import { Form, useNavigation } from "react-router";
import { VERDICT_LABELS, type ReviewVerdict } from "~/reviews/status";
import { HashPrefix, When } from "~/designs/design-bits";
import { Button, TextArea } from "~/components/ui/form";
import { Card } from "~/components/ui/card";
import { errorsOf, type ActionResult } from "./comments";

export type DecisionView = {
  id: string;
  verdict: ReviewVerdict;
  reviewerName: string;
  decidedAt: string;
  contentHash: string;
  comment: string;
};

export function DecisionsView({ decisions }: { decisions: DecisionView[] }) {
  if (decisions.length === 0) return <p className="text-sm text-ink-600">No decision yet.</p>;
  return (
    <ul className="space-y-2 text-sm" aria-label="Decisions">
      {decisions.map((d) => (
        <Card as="li" key={d.id} padding="xs" data-testid="decision">
          <p>
            <strong className={d.verdict === "approved" ? "text-moss-700" : "text-brick-700"}>
              <span aria-hidden="true">{d.verdict === "approved" ? "✓ " : "✕ "}</span>
              {VERDICT_LABELS[d.verdict]}
            </strong>{" "}
            by {d.reviewerName}, <When iso={d.decidedAt} />
          </p>
          <p className="text-xs text-ink-500">
            Signed content hash <HashPrefix hash={d.contentHash} />
          </p>
          <p className="mt-1 whitespace-pre-wrap">{d.comment}</p>
        </Card>
      ))}
    </ul>
  );
}

export function DecisionForm({ result }: { result?: ActionResult }) {
  const nav = useNavigation();
  const errors = errorsOf(result, "decide");
  const busy = nav.state !== "idle" && nav.formData?.get("intent") === "decide";
  return (
    <Form method="post" className="mt-4 space-y-3 border-t border-ink-200 pt-4" aria-label="Decide">
      <input type="hidden" name="intent" value="decide" />
      <TextArea label="Comment with your decision" name="comment" rows={3} error={errors.comment} required maxLength={4000} />
      {errors.verdict ? <p className="text-sm text-brick-700">{errors.verdict}</p> : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" name="verdict" value="approved" disabled={busy}>
          Approve revision
        </Button>
        <Button type="submit" name="verdict" value="changes-requested" tone="danger" disabled={busy}>
          Request changes
        </Button>
      </div>
      <p className="text-xs text-ink-500">
        Your decision records your name, the time and this revision's content hash. A later revision needs its own review.
      </p>
    </Form>
  );
}

export function RequestForm({
  result,
  reviewers,
}: {
  result?: ActionResult;
  reviewers: Array<{ id: string; name: string; email: string }>;
}) {
  const nav = useNavigation();
  const errors = errorsOf(result, "request");
  const busy = nav.state !== "idle" && nav.formData?.get("intent") === "request";
  if (reviewers.length === 0) {
    return (
      <p className="mt-3 text-sm text-ink-600">This workspace has no member with the reviewer role; an admin can invite one in Settings.</p>
    );
  }
  return (
    <Form method="post" className="mt-4 space-y-3 border-t border-ink-200 pt-4" aria-label="Request review">
      <input type="hidden" name="intent" value="request" />
      <fieldset aria-describedby={errors.reviewers ? "reviewers-error" : undefined}>
        <legend className="text-sm font-medium text-ink-700">Ask for a review from</legend>
        <ul className="mt-1 space-y-1">
          {reviewers.map((r) => (
            <li key={r.id}>
              <label className="flex min-h-10 items-center gap-2 text-sm">
                <input type="checkbox" name="reviewers" value={r.id} className="h-4 w-4" />
                {r.name} <span className="text-ink-500">{r.email}</span>
              </label>
            </li>
          ))}
        </ul>
        {errors.reviewers ? (
          <p id="reviewers-error" className="text-sm text-brick-700" role="alert">
            {errors.reviewers}
          </p>
        ) : null}
      </fieldset>
      <TextArea label="Note for the reviewers (optional)" name="note" rows={2} error={errors.note} maxLength={2000} />
      <Button type="submit" disabled={busy}>
        {busy ? "Sending…" : "Request review"}
      </Button>
    </Form>
  );
}

/** The reviewers asked for a review of this revision, when, and the note that asked. */
export function RequestsView({
  requests,
}: {
  requests: Array<{ id: string; reviewerName: string; requestedAt: string; note: string | null }>;
}) {
  if (requests.length === 0) return <p className="text-sm text-ink-600">Nobody has been asked to review this revision yet.</p>;
  return (
    <ul className="space-y-1 text-sm" aria-label="Reviewers asked">
      {requests.map((r) => (
        <li key={r.id}>
          <span className="font-medium">{r.reviewerName}</span>, <When iso={r.requestedAt} />
          {r.note ? <span className="block text-ink-600">“{r.note}”</span> : null}
        </li>
      ))}
    </ul>
  );
}
