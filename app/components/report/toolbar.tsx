// The report's bar on screen (not printed): back to the review, the paper size, and the PDF, each keeping
// the revision compared with.
import { Link } from "react-router";
import { reportPath, reportPdfPath, reviewPath } from "~/reviews/paths";
import { SIZES, type Size } from "./paper";

export function ReportToolbar({
  slug,
  designId,
  number,
  size,
  compare,
}: {
  slug: string;
  designId: string;
  number: number;
  size: Size;
  /** The revision compared with, when the reviewer chose one: the review, the other paper and the PDF keep it. */
  compare: number | null;
}) {
  return (
    <div className="report-toolbar sticky top-0 z-10 flex flex-wrap items-center gap-3 border-b border-ink-200 bg-ink-50 px-4 py-2 text-sm">
      <Link
        to={`${reviewPath(slug, designId, number)}${compare ? `?compare=${compare}` : ""}`}
        className="font-semibold text-copper-700 underline"
      >
        Back to the review
      </Link>
      <span className="text-ink-500">Paper:</span>
      {(Object.keys(SIZES) as Size[]).map((s) =>
        s === size ? (
          <strong key={s} aria-current="true">
            {SIZES[s]}
          </strong>
        ) : (
          <Link key={s} to={reportPath(slug, designId, number, s, compare)} className="text-copper-700 underline">
            {SIZES[s]}
          </Link>
        ),
      )}
      <a
        href={reportPdfPath(slug, designId, number, size, compare)}
        className="ml-auto rounded-md bg-copper-600 px-3 py-1.5 font-semibold text-white"
      >
        Download PDF ({SIZES[size]})
      </a>
    </div>
  );
}
