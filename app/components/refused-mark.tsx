// The mark of a stored revision that format 1.1 would refuse (decision 111): a badge for lists and
// pickers, a notice for the pages of the revision itself. It stays readable; it cannot be released.
import { REFUSED_MARK } from "~/designs/standing-words";

export function RefusedBadge({ reasons, className = "" }: { reasons: readonly string[]; className?: string }) {
  return (
    <span
      className={`inline-flex items-center rounded-full border border-brick-600 bg-brick-50 px-2 py-0.5 text-xs font-semibold text-brick-700 ${className}`}
      title={reasons.join("; ")}
      data-testid="refused-mark"
    >
      {REFUSED_MARK}
    </span>
  );
}

export function RefusedNotice({ reasons, className = "" }: { reasons: readonly string[]; className?: string }) {
  return (
    <div
      role="note"
      className={`rounded-lg border-2 border-brick-600 bg-brick-50 p-4 text-sm text-ink-800 ${className}`}
      data-testid="refused-notice"
    >
      <p className="font-semibold text-brick-700">
        {REFUSED_MARK}: this revision was saved under older rules and proves less than it seems.
      </p>
      <ul className="mt-1 list-disc pl-5 [overflow-wrap:anywhere]">
        {reasons.map((r) => (
          <li key={r}>{r[0]!.toUpperCase() + r.slice(1)}.</li>
        ))}
      </ul>
      <p className="mt-1">
        It stays readable, but it cannot be released to a vehicle. Save a revision that passes format 1.1 to replace it.
      </p>
    </div>
  );
}
