// The review's comments as the report prints them: who, when, and on what (a row, a component).
import { h2, iso } from "./paper";

export type ReportComment = {
  id: string;
  authorName: string;
  body: string;
  anchor: string;
  rowIndex: number | null;
  componentId: string | null;
  createdAt: string;
};

export function ReportComments({ comments }: { comments: ReportComment[] }) {
  return (
    <section aria-label="Review comments" data-testid="report-comments">
      <h2 className={h2}>Review comments</h2>
      {comments.length === 0 ? (
        <p className="mt-2">No comments.</p>
      ) : (
        <ul className="mt-2 space-y-2">
          {comments.map((x) => (
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
  );
}
