// Small pieces of the design pages: status badge, the "not proven" marker, dates and hashes.
import type { ReactNode } from "react";
import { describeDraftCheck, STATUS_LABELS, type DesignStatus, type DraftCheck } from "./types";
import { cardVariants } from "~/components/ui/card";
import { Badge } from "~/components/ui/badge";

export function StatusBadge({ status }: { status: DesignStatus }) {
  return <Badge tone={status === "proven" ? "proven" : "neutral"}>{STATUS_LABELS[status]}</Badge>;
}

/** The marker every unsaved working copy carries: it has not been proven by a save. */
export function NotProven({ check }: { check?: DraftCheck }) {
  const failing = check?.state === "invalid" || (check?.state === "checked" && !check.ok);
  return (
    <span className="inline-flex flex-wrap items-center gap-1.5 text-sm">
      <Badge tone="draft">
        <svg viewBox="0 0 12 12" className="h-3 w-3" aria-hidden="true">
          <circle cx="6" cy="6" r="4.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeDasharray="2 1.6" />
        </svg>
        Draft, not proven
      </Badge>
      {check ? <span className={failing ? "text-failing-ink" : "text-ink-600"}>{describeDraftCheck(check)}</span> : null}
    </span>
  );
}

export function Holds({ holds }: { holds: boolean }) {
  return holds ? (
    <span className="inline-flex items-center gap-1 font-semibold text-proven-ink">
      <svg viewBox="0 0 12 12" className="h-3 w-3" aria-hidden="true">
        <path d="M2 6.5l2.5 2.5L10 3.5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      Holds
    </span>
  ) : (
    <span className="inline-flex items-center gap-1 font-semibold text-failing-ink">
      <svg viewBox="0 0 12 12" className="h-3 w-3" aria-hidden="true">
        <path d="M3 3l6 6M9 3L3 9" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      </svg>
      Fails
    </span>
  );
}

/** A date the same on the server and in the browser (no time-zone guessing during hydration). */
export function When({ iso }: { iso: string }) {
  const text = `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
  return <time dateTime={iso}>{text}</time>;
}

export function HashPrefix({ hash }: { hash: string }) {
  return (
    <code className="rounded bg-ink-100 px-1.5 py-0.5 font-mono text-xs text-ink-700" title={`SHA-256 ${hash}`}>
      {hash.slice(0, 12)}
    </code>
  );
}

export function Section({ title, aside, children }: { title: string; aside?: ReactNode; children: ReactNode }) {
  return (
    <section className={cardVariants({ padding: "lg" })}>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 className="font-semibold">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}
