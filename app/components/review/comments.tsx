// The review's comments: the list (a row's states in the table's order) and the form that pins a
// comment to the revision, a truth-table row or a component.
import { Form, Link, useNavigation, useSearchParams } from "react-router";
import { truthTablePath } from "~/reviews/paths";
import { When } from "~/designs/design-bits";
import { Button, SelectField, TextArea, TextField } from "~/components/ui/form";
import { Card } from "~/components/ui/card";
import type { FieldErrors } from "~/lib/forms";

/** What a review page's action answers: which form it was for, and its field errors. */
export type ActionResult = { intent: string; ok: boolean; errors?: FieldErrors; message?: string; fault?: string };

const truthTableRowHref = (slug: string, designId: string, number: number, row: number) =>
  `${truthTablePath(slug, designId, number)}?from=${Math.floor(row / 100) * 100}&row=${row}`;

export type CommentView = {
  id: string;
  authorName: string;
  anchor: string;
  rowIndex: number | null;
  rowStates: Record<string, string> | null;
  componentId: string | null;
  body: string;
  createdAt: string;
};

/**
 * A row's states as "id=state, …" in the table's order of conditions (a stored row keeps its keys in
 * whatever order the database gives them); a condition the revision no longer has goes last.
 */
export function rowStatesText(states: Record<string, string>, conditionOrder: readonly string[]): string {
  const known = conditionOrder.filter((id) => Object.hasOwn(states, id));
  const rest = Object.keys(states).filter((id) => !conditionOrder.includes(id));
  return [...known, ...rest].map((k) => `${k}=${states[k]}`).join(", ");
}

export function CommentsView({
  comments,
  slug,
  designId,
  number,
  labels,
  conditionOrder,
}: {
  comments: CommentView[];
  slug: string;
  designId: string;
  number: number;
  labels: Record<string, string>;
  /** Condition ids in the truth table's order. */
  conditionOrder: readonly string[];
}) {
  if (comments.length === 0) return <p className="text-sm text-ink-600">No comments yet.</p>;
  return (
    <ul className="space-y-3" aria-label="Comments">
      {comments.map((c) => (
        <Card as="li" key={c.id} padding="sm" className="text-sm" data-testid="comment">
          <p className="text-xs text-ink-500">
            <span className="font-semibold text-ink-700">{c.authorName}</span>, <When iso={c.createdAt} />
            {c.anchor === "row" && c.rowIndex !== null ? (
              <>
                {" "}
                · on{" "}
                <Link to={truthTableRowHref(slug, designId, number, c.rowIndex)} className="text-copper-700 underline">
                  row {c.rowIndex}
                </Link>{" "}
                <span className="font-mono" data-testid="comment-row-states">
                  ({rowStatesText(c.rowStates ?? {}, conditionOrder)})
                </span>
              </>
            ) : null}
            {c.anchor === "component" && c.componentId ? (
              <>
                {" "}
                · on component <span className="font-medium">{labels[c.componentId] ?? c.componentId}</span> <code>{c.componentId}</code>
              </>
            ) : null}
          </p>
          <p className="mt-1 whitespace-pre-wrap text-ink-900">{c.body}</p>
        </Card>
      ))}
    </ul>
  );
}

export function errorsOf(result: ActionResult | undefined, intent: string): FieldErrors {
  return result && !result.ok && result.intent === intent ? (result.errors ?? {}) : {};
}

export function CommentForm({
  result,
  components,
  rows,
}: {
  result?: ActionResult;
  components: Array<{ id: string; label: string; type: string }>;
  rows: number;
}) {
  const [params] = useSearchParams();
  const presetRow = params.get("row");
  const nav = useNavigation();
  const errors = errorsOf(result, "comment");
  const busy = nav.state !== "idle" && nav.formData?.get("intent") === "comment";
  return (
    <Form method="post" className="mt-4 space-y-3 border-t border-ink-200 pt-4" id="comment" aria-label="Add a comment">
      <input type="hidden" name="intent" value="comment" />
      <fieldset>
        <legend className="text-sm font-medium text-ink-700">Pin the comment to</legend>
        <div className="mt-1 grid gap-3 sm:grid-cols-3">
          <SelectField label="Anchor" name="anchor" defaultValue={presetRow !== null ? "row" : "revision"} error={errors.anchor}>
            <option value="revision">The revision</option>
            <option value="row">A truth-table row</option>
            <option value="component">A component</option>
          </SelectField>
          <TextField
            label={`Row (0 – ${(rows - 1).toLocaleString("en-US")})`}
            name="row"
            inputMode="numeric"
            defaultValue={presetRow ?? ""}
            error={errors.row}
            hint="Used when the anchor is a row."
          />
          <SelectField label="Component" name="component" defaultValue="" error={errors.component}>
            <option value="">—</option>
            {components
              .filter((c) => c.type !== "junction")
              .map((c) => (
                <option key={c.id} value={c.id}>
                  {c.label} ({c.id})
                </option>
              ))}
          </SelectField>
        </div>
      </fieldset>
      <TextArea label="Comment" name="body" rows={3} error={errors.body} required maxLength={4000} />
      <Button type="submit" tone="secondary" disabled={busy}>
        {busy ? "Adding…" : "Add comment"}
      </Button>
    </Form>
  );
}
