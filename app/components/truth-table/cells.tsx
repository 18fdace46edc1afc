// Cell values of the truth table: every value is text plus a shape; colour only repeats the meaning.
import type { RuleCell } from "~/reviews/truth-table";

export function ContactCell({ closed }: { closed: boolean }) {
  return closed ? (
    <span className="font-medium text-ink-900" title="closed (conducts)">
      <span aria-hidden="true">━ </span>closed
    </span>
  ) : (
    <span className="text-ink-500" title="open">
      <span aria-hidden="true">╱ </span>open
    </span>
  );
}

export function LiveCell({ on, yes = "on", no = "off" }: { on: boolean; yes?: string; no?: string }) {
  return on ? (
    <span className="font-medium text-ink-900">
      <span aria-hidden="true">● </span>
      {yes}
    </span>
  ) : (
    <span className="text-ink-500">
      <span aria-hidden="true">○ </span>
      {no}
    </span>
  );
}

export function DriveCell({ drive }: { drive: boolean }) {
  return drive ? (
    <span className="inline-flex items-center gap-1 rounded bg-moss-100 px-1.5 font-semibold text-moss-700">
      <span aria-hidden="true">▶</span>DRIVE
    </span>
  ) : (
    <span className="text-ink-500">
      <span aria-hidden="true">■ </span>no
    </span>
  );
}

export function RuleCellView({ cell }: { cell: RuleCell }) {
  if (cell === "violating") {
    return (
      <span className="inline-flex items-center gap-1 rounded bg-brick-100 px-1.5 font-semibold text-brick-700">
        <span aria-hidden="true">✕</span>violating
      </span>
    );
  }
  if (cell === "failing") {
    return (
      <span
        className="inline-flex items-center gap-1 rounded bg-brick-100 px-1.5 font-semibold text-brick-700"
        title="the vehicle must drive in this row and does not"
      >
        <span aria-hidden="true">✕</span>failing
      </span>
    );
  }
  if (cell === "demand") {
    return (
      <span className="inline-flex items-center gap-1 text-moss-700" title="the vehicle must drive in this row, and does">
        <span aria-hidden="true">▷</span>demand
      </span>
    );
  }
  if (cell === "unsafe") {
    return (
      <span className="inline-flex items-center gap-1 text-copper-700">
        <span aria-hidden="true">▲</span>unsafe
      </span>
    );
  }
  return (
    <span className="text-ink-400" title="the rule's condition does not hold in this row">
      —
    </span>
  );
}
